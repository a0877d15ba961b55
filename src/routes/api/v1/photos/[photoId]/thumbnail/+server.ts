import { objectAccess } from '$lib/server/access';
import { fileResponse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { photoBytes, photoRow } from '$lib/server/photos/store';

export async function GET(event) {
	await objectAccess(event, 'read', 'photo', event.params.photoId);
	const row = (await photoRow(db(), event.params.photoId))!;
	const response = fileResponse(await photoBytes(row.thumbnailKey), 'image/webp', 'thumbnail.webp', 'private');
	response.headers.set('content-disposition', 'inline');
	return response;
}
