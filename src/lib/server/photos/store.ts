import { and, desc, eq } from 'drizzle-orm';
import type { Database, Queryable } from '../db';
import { user, wheelPhoto } from '../db/schema';
import { logActivity } from '../activity';
import { touchBuild } from '../builds';
import { deleteObject, getObject, putObject } from '../storage';
import type { intakePhoto } from './intake';

// Wheel photos: bytes in the object store, the row in PostgreSQL. The objects are written first
// and removed again if the row cannot be, so a refused or failed upload leaves nothing behind.

type Accepted = Extract<Awaited<ReturnType<typeof intakePhoto>>, { ok: true }>['photo'];

export const photoColumns = {
	id: wheelPhoto.id,
	name: wheelPhoto.name,
	mime: wheelPhoto.mime,
	width: wheelPhoto.width,
	height: wheelPhoto.height,
	sizeBytes: wheelPhoto.sizeBytes,
	photoReading: wheelPhoto.photoReading,
	uploadedBy: user.email,
	createdAt: wheelPhoto.createdAt
};

export async function storePhoto(database: Database, where: { workshopId: string; buildId: string }, photo: Accepted, uploadedBy: string) {
	const id = crypto.randomUUID();
	const base = `photos/${where.workshopId}/${where.buildId}/${id}`;
	const storageKey = `${base}.${photo.ext}`;
	const thumbnailKey = `${base}-thumb.webp`;
	const written: string[] = [];
	try {
		await putObject(storageKey, photo.bytes, photo.mime);
		written.push(storageKey);
		await putObject(thumbnailKey, photo.thumbnail.bytes, photo.thumbnail.mime);
		written.push(thumbnailKey);
		await database.transaction(async (tx) => {
			await tx.insert(wheelPhoto).values({
				id,
				buildId: where.buildId,
				name: photo.name,
				mime: photo.mime,
				width: photo.width,
				height: photo.height,
				sizeBytes: photo.bytes.length,
				sha256: photo.sha256,
				storageKey,
				thumbnailKey,
				uploadedBy
			});
			await logActivity(tx, {
				buildId: where.buildId,
				actorId: uploadedBy,
				kind: 'photo',
				summary: `Photo “${photo.name}” (${photo.width} × ${photo.height})`
			});
			await touchBuild(tx, where.buildId);
		});
	} catch (err) {
		await Promise.allSettled(written.map((key) => deleteObject(key)));
		throw err;
	}
	return id;
}

export async function photosOf(database: Queryable, buildId: string) {
	return database
		.select(photoColumns)
		.from(wheelPhoto)
		.leftJoin(user, eq(user.id, wheelPhoto.uploadedBy))
		.where(eq(wheelPhoto.buildId, buildId))
		.orderBy(desc(wheelPhoto.createdAt));
}

export async function photoRow(database: Queryable, photoId: string) {
	const [row] = await database.select().from(wheelPhoto).where(eq(wheelPhoto.id, photoId));
	return row;
}

export async function photoBytes(key: string) {
	return (await getObject(key)).body;
}

export async function saveReading(
	database: Database,
	photo: { id: string; buildId: string; name: string },
	reading: Record<string, unknown>,
	summary: string,
	actorId: string
) {
	await database.transaction(async (tx) => {
		await tx
			.update(wheelPhoto)
			.set({ photoReading: reading })
			.where(and(eq(wheelPhoto.id, photo.id), eq(wheelPhoto.buildId, photo.buildId)));
		await logActivity(tx, { buildId: photo.buildId, actorId, kind: 'reading', summary: `Photo reading of “${photo.name}”: ${summary}` });
	});
}

/** Removes the row, then the objects (an orphaned object is harmless; a row without its object is not). */
export async function deletePhoto(database: Database, photoId: string, buildId: string, actorId: string): Promise<boolean> {
	const removed = await database.transaction(async (tx) => {
		const rows = await tx
			.delete(wheelPhoto)
			.where(and(eq(wheelPhoto.id, photoId), eq(wheelPhoto.buildId, buildId)))
			.returning();
		const row = rows[0];
		if (row) await logActivity(tx, { buildId, actorId, kind: 'photo', summary: `Photo “${row.name}” removed` });
		return row;
	});
	if (!removed) return false;
	await Promise.allSettled([deleteObject(removed.storageKey), deleteObject(removed.thumbnailKey)]);
	return true;
}

/** Every object key of a build's photos, for removing them with the build. */
export async function photoKeysOf(database: Queryable, buildId: string): Promise<string[]> {
	const rows = await database
		.select({ a: wheelPhoto.storageKey, b: wheelPhoto.thumbnailKey })
		.from(wheelPhoto)
		.where(eq(wheelPhoto.buildId, buildId));
	return rows.flatMap((r) => [r.a, r.b]);
}
