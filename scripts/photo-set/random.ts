// Seeded randomness so a case renders the same from its seed on any machine.
export function rng(seed: number) {
	let a = seed >>> 0;
	const next = () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
	const between = (lo: number, hi: number) => lo + (hi - lo) * next();
	const pick = <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)]!;
	let spare: number | null = null;
	const gauss = () => {
		if (spare !== null) {
			const s = spare;
			spare = null;
			return s;
		}
		const u = Math.max(next(), 1e-12);
		const v = next();
		const m = Math.sqrt(-2 * Math.log(u));
		spare = m * Math.sin(2 * Math.PI * v);
		return m * Math.cos(2 * Math.PI * v);
	};
	return { next, between, pick, gauss };
}
export type Rng = ReturnType<typeof rng>;
