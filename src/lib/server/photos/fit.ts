// Small geometry shared by the photo reading: a point, and a linear solve.

export interface Pt {
	x: number;
	y: number;
}

/** Solves the n x n system M x = v in place (Gauss with partial pivoting); null when singular. */
export function solve(M: number[][], v: number[]): number[] | null {
	const n = v.length;
	for (let i = 0; i < n; i++) {
		let p = i;
		for (let r = i + 1; r < n; r++) if (Math.abs(M[r]![i]!) > Math.abs(M[p]![i]!)) p = r;
		if (Math.abs(M[p]![i]!) < 1e-12) return null;
		[M[i], M[p]] = [M[p]!, M[i]!];
		[v[i], v[p]] = [v[p]!, v[i]!];
		for (let r = i + 1; r < n; r++) {
			const f = M[r]![i]! / M[i]![i]!;
			for (let c = i; c < n; c++) M[r]![c]! -= f * M[i]![c]!;
			v[r]! -= f * v[i]!;
		}
	}
	const x = new Array<number>(n).fill(0);
	for (let i = n - 1; i >= 0; i--) {
		let s = v[i]!;
		for (let c = i + 1; c < n; c++) s -= M[i]![c]! * x[c]!;
		x[i] = s / M[i]![i]!;
	}
	return x;
}
