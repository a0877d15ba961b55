import { json } from '@sveltejs/kit';
import { objectAccess } from '$lib/server/access';
import { db } from '$lib/server/db';
import { intakePhoto, photoLimits } from '$lib/server/photos/intake';
import { decodeSlot } from '$lib/server/photos/limit';
import { storePhoto } from '$lib/server/photos/store';
import { listAnswer } from '$lib/server/build-list-route';
import { photosById } from '$lib/server/build-lists';

const maxFiles = 12;
const MB = 1024 * 1024;
/** One request carries at most a photo at the cap plus the form's framing (BODY_SIZE_LIMIT is set to match: 21M). */
const maxRequestBytes = photoLimits.maxBytes + MB;
const tooLarge = `file: at most ${photoLimits.maxBytes / MB} MB per photo, and ${maxRequestBytes / MB} MB per upload (send large photos one at a time)`;

/** The newest 50 photos, or the 50 after `cursor`; `next` gives the page after (null on the last). */
export async function GET(event) {
	return listAnswer(event, 'photos');
}

const refusal = (status: number, message: string) => json({ message, code: 'invalid', errors: { file: message } }, { status });

/**
 * Uploads wheel photos (multipart, one or more `file` fields). Every file is checked by its bytes
 * before any is stored: one refusal stores none, so a retry cannot leave doubles.
 */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const declared = Number(event.request.headers.get('content-length') ?? 0);
	if (declared > maxRequestBytes) return refusal(413, tooLarge);
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch (err) {
		// The server's body limit stops a body that outgrows its declared length as it streams in.
		if ((err as { status?: number }).status === 413) return refusal(413, tooLarge);
		return refusal(400, 'file: send the photos as multipart/form-data, each in a field named file');
	}
	const files = form.getAll('file').filter((f): f is File => typeof f !== 'string');
	if (!files.length) return refusal(400, 'file: choose at least one photo (JPEG, PNG or WebP)');
	if (files.length > maxFiles) return refusal(400, `file: at most ${maxFiles} photos at once`);

	const accepted = [];
	for (const file of files) {
		if (file.size > photoLimits.maxBytes) return refusal(413, `file: “${file.name}” is over ${photoLimits.maxBytes / MB} MB`);
		const bytes = Buffer.from(await file.arrayBuffer());
		const result = await decodeSlot(() => intakePhoto(bytes, file.name));
		if (!result.ok) return refusal(result.status, files.length > 1 ? `${result.message} (“${file.name}”)` : result.message);
		accepted.push(result.photo);
	}
	const ids = [];
	for (const photo of accepted)
		ids.push(await storePhoto(db(), { workshopId: access.workshop.id, buildId: access.buildId }, photo, access.user.id));
	return json({ photos: await photosById(db(), access.buildId, ids) }, { status: 201 });
}
