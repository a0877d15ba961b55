// Hub keyways for the shaft's key. Rows entered from memory of the standards' tables; check them
// against your copy of the standard before cutting a production part.
import { MM_PER_IN } from './units';

export interface HubSlot {
	/** Slot width across the key, mm. */
	widthMm: number;
	/** Slot depth into the hub, measured from the bore at the slot's centre line, mm. */
	depthMm: number;
	/** Where the numbers come from, for the spec sheet. */
	source: string;
}

/** DIN 6885-1 parallel keys (form A): shaft over…up to (mm) -> key b x h, hub keyway depth t2. From memory. */
export const din6885 = [
	{ over: 6, upTo: 8, b: 2, h: 2, t2: 1.0 },
	{ over: 8, upTo: 10, b: 3, h: 3, t2: 1.4 },
	{ over: 10, upTo: 12, b: 4, h: 4, t2: 1.8 },
	{ over: 12, upTo: 17, b: 5, h: 5, t2: 2.3 },
	{ over: 17, upTo: 22, b: 6, h: 6, t2: 2.8 },
	{ over: 22, upTo: 30, b: 8, h: 7, t2: 3.3 },
	{ over: 30, upTo: 38, b: 10, h: 8, t2: 3.3 },
	{ over: 38, upTo: 44, b: 12, h: 8, t2: 3.3 },
	{ over: 44, upTo: 50, b: 14, h: 9, t2: 3.8 },
	{ over: 50, upTo: 58, b: 16, h: 10, t2: 4.3 },
	{ over: 58, upTo: 65, b: 18, h: 11, t2: 4.4 },
	{ over: 65, upTo: 75, b: 20, h: 12, t2: 4.9 },
	{ over: 75, upTo: 85, b: 22, h: 14, t2: 5.4 },
	{ over: 85, upTo: 95, b: 25, h: 14, t2: 5.4 },
	{ over: 95, upTo: 110, b: 28, h: 16, t2: 6.4 }
] as const;

/**
 * ANSI B17.1 square parallel keys: shaft over…up to (inches) -> key width = height; the hub
 * keyseat is half the key height deep (nominal). From memory.
 */
export const ansiB171 = [
	{ over: 5 / 16, upTo: 7 / 16, w: 3 / 32 },
	{ over: 7 / 16, upTo: 9 / 16, w: 1 / 8 },
	{ over: 9 / 16, upTo: 7 / 8, w: 3 / 16 },
	{ over: 7 / 8, upTo: 1.25, w: 1 / 4 },
	{ over: 1.25, upTo: 1.375, w: 5 / 16 },
	{ over: 1.375, upTo: 1.75, w: 3 / 8 },
	{ over: 1.75, upTo: 2.25, w: 1 / 2 },
	{ over: 2.25, upTo: 2.75, w: 5 / 8 },
	{ over: 2.75, upTo: 3.25, w: 3 / 4 }
] as const;

export const dinShaftRange = { min: din6885[0].over, max: din6885[din6885.length - 1]!.upTo };
export const ansiShaftRangeIn = { min: ansiB171[0].over, max: ansiB171[ansiB171.length - 1]!.upTo };

export function dinSlot(shaftMm: number): HubSlot | undefined {
	const row = din6885.find((r) => shaftMm > r.over && shaftMm <= r.upTo);
	return row && { widthMm: row.b, depthMm: row.t2, source: `DIN 6885-1 key ${row.b} x ${row.h} for shaft over ${row.over} to ${row.upTo} mm (t2 = ${row.t2} mm)` };
}

export function ansiSlot(shaftIn: number): HubSlot | undefined {
	const row = ansiB171.find((r) => shaftIn > r.over && shaftIn <= r.upTo);
	return (
		row && {
			widthMm: row.w * MM_PER_IN,
			depthMm: (row.w / 2) * MM_PER_IN,
			source: `ANSI B17.1 square key ${fraction(row.w)} in for shaft over ${fraction(row.over)} to ${fraction(row.upTo)} in (hub depth ${fraction(row.w / 2)} in)`
		}
	);
}

/**
 * ANSI B17.2 Woodruff keys are numbered by size: the last two digits give the nominal diameter
 * in eighths of an inch, the digits before them the width in 32nds (No. 404 = 1/8 x 1/2). The
 * key stands half its width above the shaft, so the hub slot is width/2 deep plus 0.005 in
 * clearance. All from memory.
 */
export function woodruffSlot(keyNumber: string): HubSlot | undefined {
	const m = /^(\d{1,2})(\d{2})$/.exec(keyNumber.trim());
	if (!m) return undefined;
	const width = Number(m[1]) / 32;
	const dia = Number(m[2]) / 8;
	if (width <= 0 || dia <= 0 || width >= dia) return undefined;
	return {
		widthMm: width * MM_PER_IN,
		depthMm: (width / 2 + 0.005) * MM_PER_IN,
		source: `ANSI B17.2 Woodruff key No. ${keyNumber} (${fraction(width)} x ${fraction(dia)} in), hub slot ${(width / 2 + 0.005).toFixed(4)} in deep`
	};
}

/** 0.1875 -> "3/16", 1.25 -> "1 1/4" (to 64ths). */
export function fraction(x: number): string {
	const whole = Math.floor(x + 1e-9);
	let num = Math.round((x - whole) * 64);
	let den = 64;
	while (num && num % 2 === 0) {
		num /= 2;
		den /= 2;
	}
	if (!num) return `${whole}`;
	return whole ? `${whole} ${num}/${den}` : `${num}/${den}`;
}
