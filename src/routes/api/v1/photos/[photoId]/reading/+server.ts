import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { checkPhotoTaps } from '$lib/schemas/photo';
import { refusal } from '$lib/schemas/refusal';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { decodeSlot } from '$lib/server/photos/limit';
import { readPhoto } from '$lib/server/photos/reading';
import { photoBytes, photoRow, saveReading } from '$lib/server/photos/store';
import { readingToDesign } from '$lib/server/photos/to-design';

/** Any JSON object: `checkPhotoTaps` reads its fields, as it does on the page. */
const anyObject = z.record(z.string(), z.unknown());

/**
 * Reads the teeth of the wheel in a photo from the user's taps: the centre and one or more tooth
 * tips, in the stored image's pixels (optionally the known outside diameter, `od` in `units`, or
 * the older `odMm`). Editors store the reading on the photo; anyone who may read the build may try one.
 * A refusal adds `advice` (what would help in this photo) and `ellipse` (the tip outline tried).
 */
export async function POST(event) {
	const access = await objectAccess(event, 'read', 'photo', event.params.photoId);
	const body = await jsonBody(event.request, anyObject);
	if (!body.ok) return body.response;
	const row = (await photoRow(db(), event.params.photoId))!;
	const taps = checkPhotoTaps(body.data, row);
	if (!taps.ok) return refuse(taps.refusals);
	const bytes = Buffer.from(await photoBytes(row.storageKey));
	const reading = await decodeSlot(() => readPhoto(bytes, taps.value));
	// What would help in this photo, and the outline that was tried, so the page can show a bad fit.
	if (!reading.ok)
		return refuse([refusal(reading.field, reading.message)], 400, {
			advice: reading.advice,
			...(reading.ellipse ? { ellipse: reading.ellipse } : {})
		});
	const design = readingToDesign(reading, taps.value.odMm, taps.value.units);
	if (access.can.edit) {
		await saveReading(
			db(),
			row,
			{ taps: taps.value, ...reading },
			`${reading.teeth}-${reading.missing}, confidence ${Math.round(reading.confidence * 100)} %`,
			access.user.id
		);
	}
	return json({ reading, design, stored: access.can.edit });
}
