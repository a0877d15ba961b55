import { error } from '@sveltejs/kit';
import type { Pt } from '$lib/schemas/photo';
import { objectAccess } from '$lib/server/access';
import { getBuild } from '$lib/server/builds';
import { db } from '$lib/server/db';
import { photoRow } from '$lib/server/photos/store';
import { readingToDesign } from '$lib/server/photos/to-design';
import type { Units } from '$lib/trade/units';
import type { PageServerLoad } from './$types';

const isPt = (p: unknown): p is Pt => typeof p === 'object' && p !== null && Number.isFinite((p as Pt).x) && Number.isFinite((p as Pt).y);

/** The photo reading stored on the row, with the taps it came from; null when there is none or it is not one we can show. */
function storedReading(saved: Record<string, unknown> | null) {
	if (!saved) return null;
	const { taps, ...reading } = saved as { taps?: { centre?: unknown; tips?: unknown; odMm?: unknown; units?: unknown } } & Record<
		string,
		unknown
	>;
	if (!taps || !isPt(taps.centre) || !Array.isArray(taps.tips) || !taps.tips.every(isPt)) return null;
	if (
		typeof reading.teeth !== 'number' ||
		typeof reading.missing !== 'number' ||
		!Array.isArray(reading.gaps) ||
		typeof reading.duty !== 'number'
	)
		return null;
	const odMm = typeof taps.odMm === 'number' ? taps.odMm : undefined;
	// Readings stored before the units were kept were given in mm.
	const units: Units = taps.units === 'in' ? 'in' : 'mm';
	return {
		taps: { centre: taps.centre, tips: taps.tips as Pt[], units, ...(odMm ? { odMm } : {}) },
		reading,
		design: readingToDesign(reading as unknown as Parameters<typeof readingToDesign>[0], odMm, units)
	};
}

export const load: PageServerLoad = async (event) => {
	const access = await objectAccess(event, 'read', 'photo', event.params.photoId);
	const row = await photoRow(db(), event.params.photoId);
	// The photo exists in the caller's workshops but under another build: as if it did not exist.
	if (!row || row.buildId !== event.params.buildId || access.buildId !== event.params.buildId)
		error(404, { message: 'No such photo in this build.', code: 'not-found' });
	const build = await getBuild(db(), access.buildId);
	return {
		build: { id: access.buildId, name: build?.name ?? '' },
		photo: {
			id: row.id,
			name: row.name,
			mime: row.mime,
			width: row.width,
			height: row.height,
			sizeBytes: row.sizeBytes,
			createdAt: row.createdAt
		},
		stored: storedReading(row.photoReading),
		role: access.workshop.role,
		can: access.can
	};
};
