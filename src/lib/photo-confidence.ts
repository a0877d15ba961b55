// The photo reading's confidence in words, one threshold for the reader (server) and the photo page
// (browser): no server imports here. Where "high" starts is calibrated on the photo set's
// calibration images only (tests/fixtures/photo-set c01..c16, all three tap sets): see the figures
// beside HIGH_CONFIDENCE.

export type ConfidenceWord = 'high' | 'medium' | 'low';

/**
 * At and above this confidence a reading is called "high". Calibration (2026-12-02), c01..c16 with
 * the harness's three tap sets (accurate, 15 px off, centre and one tip): 25 readings right, 2
 * wrong, the higher wrong one at 0.88 (a 60-2 read as 60-5); every reading above 0.88 was right.
 * 0.95 leaves a margin over it: 10 readings there, all right. Checked afterwards on t01..t24 (72
 * readings): no wrong reading at or above 0.95 (the highest wrong one 0.42).
 */
export const HIGH_CONFIDENCE = 0.95;
/** Below this the page says "low, count them yourself". */
export const MEDIUM_CONFIDENCE = 0.6;

export function confidenceWord(c: number): ConfidenceWord {
	return c >= HIGH_CONFIDENCE ? 'high' : c >= MEDIUM_CONFIDENCE ? 'medium' : 'low';
}
