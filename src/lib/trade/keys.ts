// Hub keyways for the shaft's key, from the standards' tables. Each table says where its rows come
// from; rows marked "from memory" were not found in a published copy: check them against your
// copy of the standard before cutting a production part.
import { MM_PER_IN } from './units';

export interface HubSlot {
	/** Slot width across the key, mm. */
	widthMm: number;
	/** Slot depth into the hub, measured from the bore at the slot's centre line, mm. */
	depthMm: number;
	/** Where the numbers come from, for the spec sheet. */
	source: string;
}

/**
 * A shaft typed in the other unit system lands a float's hair off a row limit (22.225 mm is
 * 0.8750000000000001 in): anything within a micrometre of a limit counts as on it.
 */
const LIMIT_TOLERANCE_MM = 0.001;

/** The row whose range "over … up to and including …" holds the shaft, limits in mm. */
function rowFor<R extends { over: number; upTo: number }>(rows: readonly R[], shaftMm: number, mmPerUnit: number): R | undefined {
	return rows.find((r) => shaftMm > r.over * mmPerUnit + LIMIT_TOLERANCE_MM && shaftMm <= r.upTo * mmPerUnit + LIMIT_TOLERANCE_MM);
}

/**
 * DIN 6885-1 parallel keys (form A): shaft over…up to (mm) -> key b x h, hub keyway depth t2 over
 * the bore. Rows over 38 up to 230 mm as in Siemens' catalogue MD 31.1 (2016), "Parallel key and
 * keyway according to DIN 6885-1"; up to 22 mm as in a published DIN 6885 extract; the rest
 * (22–38 and 230–500 mm) from memory.
 */
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
	{ over: 95, upTo: 110, b: 28, h: 16, t2: 6.4 },
	{ over: 110, upTo: 130, b: 32, h: 18, t2: 7.4 },
	{ over: 130, upTo: 150, b: 36, h: 20, t2: 8.4 },
	{ over: 150, upTo: 170, b: 40, h: 22, t2: 9.4 },
	{ over: 170, upTo: 200, b: 45, h: 25, t2: 10.4 },
	{ over: 200, upTo: 230, b: 50, h: 28, t2: 11.4 },
	{ over: 230, upTo: 260, b: 56, h: 32, t2: 12.4 },
	{ over: 260, upTo: 290, b: 63, h: 32, t2: 12.4 },
	{ over: 290, upTo: 330, b: 70, h: 36, t2: 14.4 },
	{ over: 330, upTo: 380, b: 80, h: 40, t2: 15.4 },
	{ over: 380, upTo: 440, b: 90, h: 45, t2: 17.4 },
	{ over: 440, upTo: 500, b: 100, h: 50, t2: 19.5 }
] as const;

/**
 * ANSI B17.1 key size versus shaft diameter, square keys (W = H), inches: Table 1 of the
 * standard as printed in Machinery's Handbook. Square keys are the preferred ones up to 6 1/2 in,
 * where this table stops (above it the standard prefers rectangular keys).
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
	{ over: 2.75, upTo: 3.25, w: 3 / 4 },
	{ over: 3.25, upTo: 3.75, w: 7 / 8 },
	{ over: 3.75, upTo: 4.5, w: 1 },
	{ over: 4.5, upTo: 5.5, w: 1.25 },
	{ over: 5.5, upTo: 6.5, w: 1.5 }
] as const;

/** B17.1's allowance C in the hub depth T for parallel keys (clearance), inches. */
const B171_PARALLEL_ALLOWANCE_IN = 0.005;

export const dinShaftRange = { min: din6885[0].over, max: din6885[din6885.length - 1]!.upTo };
export const ansiShaftRangeIn = { min: ansiB171[0].over, max: ansiB171[ansiB171.length - 1]!.upTo };

export function dinSlot(shaftMm: number): HubSlot | undefined {
	const row = rowFor(din6885, shaftMm, 1);
	return (
		row && {
			widthMm: row.b,
			depthMm: row.t2,
			source: `DIN 6885-1 key ${row.b} x ${row.h} for shaft over ${row.over} to ${row.upTo} mm (t2 = ${row.t2} mm)`
		}
	);
}

/**
 * B17.1 measures the hub keyseat from the corner where its side meets the bore (the chord), not
 * from the bore on the centre line: T = D − Y + H/2 + C across the bore, Y = (D − √(D² − W²))/2
 * the chordal height (Machinery's Handbook, "depth control values S and T"). Over the bore on the
 * centre line that is T − D.
 */
export function ansiHubDepthIn(shaftIn: number, keyIn: number): number {
	const chordalHeight = (shaftIn - Math.sqrt(shaftIn * shaftIn - keyIn * keyIn)) / 2;
	return keyIn / 2 + B171_PARALLEL_ALLOWANCE_IN - chordalHeight;
}

export function ansiSlot(shaftIn: number): HubSlot | undefined {
	const row = rowFor(ansiB171, shaftIn * MM_PER_IN, MM_PER_IN);
	if (!row) return undefined;
	const depthIn = ansiHubDepthIn(shaftIn, row.w);
	return {
		widthMm: row.w * MM_PER_IN,
		depthMm: depthIn * MM_PER_IN,
		source: `ANSI B17.1 square key ${fraction(row.w)} in for shaft over ${fraction(row.over)} to ${fraction(row.upTo)} in (hub depth T = ${(shaftIn + depthIn).toFixed(3)} in across a ${inches(shaftIn)} in bore)`
	};
}

/**
 * ANSI B17.2 Woodruff key numbers: the last two digits (with a half, 202.5) give the nominal
 * diameter in eighths of an inch, the digits before them the width in 32nds (No. 404 = 1/8 x 1/2);
 * "-1" marks the smaller key of the same keyseat. The list of sizes as printed in Machinery's
 * Handbook's table of B17.2 keys, from memory.
 */
export const woodruffNumbers = [
	'202',
	'202.5',
	'302.5',
	'203',
	'303',
	'403',
	'204',
	'304',
	'404',
	'305',
	'405',
	'505',
	'605',
	'406',
	'506',
	'606',
	'806',
	'507',
	'607',
	'707',
	'807',
	'608',
	'708',
	'808',
	'1008',
	'1208',
	'609',
	'709',
	'809',
	'1009',
	'610',
	'710',
	'810',
	'1010',
	'1210',
	'811',
	'1011',
	'1211',
	'812',
	'1012',
	'1212',
	'617-1',
	'817-1',
	'1017-1',
	'1217-1',
	'617',
	'817',
	'1017',
	'1217',
	'822-1',
	'1022-1',
	'1222-1',
	'1422-1',
	'1622-1',
	'822',
	'1022',
	'1222',
	'1422',
	'1622',
	'1228',
	'1428',
	'1628',
	'1828',
	'2028',
	'2228',
	'2428'
] as const;

/**
 * B17.2 hub keyseat depth by key width (32nds of an inch -> inches). Widths 1/16 to 3/8 as in
 * Shigley's Mechanical Engineering Design, Table 7-7 (after ANSI B17.2); 7/32 and 7/16 to 3/4
 * from memory.
 */
const woodruffHubDepthIn: Record<number, number> = {
	2: 0.0372,
	3: 0.0529,
	4: 0.0685,
	5: 0.0841,
	6: 0.0997,
	7: 0.1153,
	8: 0.131,
	10: 0.1622,
	12: 0.1935,
	14: 0.2247,
	16: 0.256,
	18: 0.2872,
	20: 0.3185,
	22: 0.3497,
	24: 0.381
};

export function woodruffSlot(keyNumber: string): HubSlot | undefined {
	const number = keyNumber.trim();
	if (!(woodruffNumbers as readonly string[]).includes(number)) return undefined;
	const m = /^(\d{1,2})(\d{2}(?:\.5)?)(-1)?$/.exec(number)!;
	const width32 = Number(m[1]);
	const width = width32 / 32;
	const dia = Number(m[2]) / 8;
	const depth = woodruffHubDepthIn[width32]!;
	return {
		widthMm: width * MM_PER_IN,
		depthMm: depth * MM_PER_IN,
		source: `ANSI B17.2 Woodruff key No. ${number} (${fraction(width)} x ${fraction(dia)} in), hub keyseat ${depth.toFixed(4)} in deep`
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

/** A shaft as a machinist writes it: a fraction when it is one to 64ths, else three decimals. */
const inches = (x: number) => (Math.abs(x * 64 - Math.round(x * 64)) < 1e-6 ? fraction(x) : x.toFixed(3));

export interface HubDimension {
	/** What the standard calls it: "d + t2" (DIN 6885-1), "T" (B17.1), or a plain "bore + depth". */
	name: string;
	/** From the far side of the bore, across its centre, to the keyway's floor, mm. */
	mm: number;
	/** Where the way of measuring comes from, for the drawing. */
	source: string;
}

/**
 * The keyway's depth as a shop measures it over the bore: a gauge on the bore's far side, across
 * the centre, to the keyway's floor. DIN 6885-1 states it as d + t2 (t2 over the bore on the centre
 * line); B17.1 as T = D − Y + H/2 + C from the far side of the bore (ansiHubDepthIn: T − D is the
 * slot's depth over the bore on the centre line); B17.2 and a custom slot give the depth over the
 * bore, so the same sum.
 */
export function hubDimension(boreMm: number, slot: HubSlot): HubDimension {
	const mm = boreMm + slot.depthMm;
	if (slot.source.startsWith('DIN 6885-1')) return { name: 'd + t2', mm, source: 'DIN 6885-1: hub dimension d + t2' };
	if (slot.source.startsWith('ANSI B17.1')) return { name: 'T', mm, source: 'ANSI B17.1: hub depth T from the far side of the bore' };
	return { name: 'bore + depth', mm, source: 'from the far side of the bore to the keyway floor' };
}
