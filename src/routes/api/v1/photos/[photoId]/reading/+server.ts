import { json } from '@sveltejs/kit';
import { photoTaps } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { decodeSlot } from '$lib/server/photos/limit';
import { readPhoto } from '$lib/server/photos/reading';
import { photoBytes, photoRow, saveReading } from '$lib/server/photos/store';
import { readingToDesign } from '$lib/server/photos/to-design';

/**
 * Reads the teeth of the wheel in a photo from the user's taps: the centre and one or more tooth
 * tips, in the stored image's pixels (optionally the known outer diameter). Editors store the
 * reading on the photo; anyone who may read the build may try one.
 */
export async function POST(event) {
	const access = await objectAccess(event, 'read', 'photo', event.params.photoId);
	const body = await jsonBody(event.request, photoTaps);
	if (!body.ok) return body.response;
	const row = (await photoRow(db(), event.params.photoId))!;
	const outside = [body.data.centre, ...body.data.tips].findIndex((p) => p.x < 0 || p.y < 0 || p.x > row.width || p.y > row.height);
	if (outside >= 0) return refuse({ [outside === 0 ? 'centre' : 'tips']: `${outside === 0 ? 'centre' : 'tips'}: inside the photo, 0 to ${row.width} across and 0 to ${row.height} down` });
	const bytes = Buffer.from(await photoBytes(row.storageKey));
	const reading = await decodeSlot(() => readPhoto(bytes, body.data));
	if (!reading.ok) return refuse({ [reading.field]: reading.message });
	const design = readingToDesign(reading, body.data.odMm);
	if (access.can.edit) {
		await saveReading(db(), row, { taps: body.data, ...reading }, `${reading.teeth}-${reading.missing}, confidence ${Math.round(reading.confidence * 100)} %`, access.user.id);
	}
	return json({ reading, design, stored: access.can.edit });
}
