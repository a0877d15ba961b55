/** One photo as `photosOf()` (src/lib/server/photos/store.ts) lists it. */
export interface PhotoRow {
	id: string;
	name: string;
	mime: string;
	width: number;
	height: number;
	sizeBytes: number;
	photoReading: Record<string, unknown> | null;
	uploadedBy: string | null;
	createdAt: Date | string;
}

/** "36-1, 92 %" from a stored photo reading, or null when there is none. */
export function readingLine(reading: Record<string, unknown> | null | undefined): string | null {
	if (!reading) return null;
	const { teeth, missing, confidence } = reading;
	if (typeof teeth !== 'number' || typeof missing !== 'number') return null;
	const sure = typeof confidence === 'number' ? `, ${Math.round(confidence * 100)} %` : '';
	return `${teeth}-${missing}${sure}`;
}
