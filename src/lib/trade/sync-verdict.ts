// The sync margin in words, for the signal page, the build page and the build sheet alike.

export type SyncVerdict = 'safe' | 'tight' | 'fails';

/**
 * Under this margin (a fraction) the gap still stands out in the simulation, but less than a worn
 * sensor, a weak battery's slower cranking or a noisy signal can take away. Our own rule of thumb,
 * from memory, not from any ECU maker's figure.
 */
export const tightBelow = 0.15;

/** safe, tight or fails: a negative margin means the rule misses the gap or takes an ordinary space for it somewhere. */
export function syncVerdict(margin: number): SyncVerdict {
	if (!(margin >= 0)) return 'fails';
	return margin < tightBelow ? 'tight' : 'safe';
}
