import { error } from '@sveltejs/kit';
import { objectAccess } from '$lib/server/access';
import { fileResponse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { deletePhoto, photoBytes, photoRow } from '$lib/server/photos/store';

/** The stored photo (upright, metadata removed). */
export async function GET(event) {
	await objectAccess(event, 'read', 'photo', event.params.photoId);
	const row = (await photoRow(db(), event.params.photoId))!;
	const response = fileResponse(await photoBytes(row.storageKey), row.mime, row.name, 'private');
	// RFC 8187 ext-value: encodeURIComponent leaves ' ( ) * as they are, which the value may not hold.
	const encoded = encodeURIComponent(row.name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
	response.headers.set('content-disposition', `inline; filename*=UTF-8''${encoded}`);
	return response;
}

export async function DELETE(event) {
	const access = await objectAccess(event, 'edit', 'photo', event.params.photoId);
	if (!(await deletePhoto(db(), event.params.photoId, access.buildId, access.user.id)))
		error(404, { message: 'No such photo in your workshops.', code: 'not-found' });
	return new Response(null, { status: 204 });
}
