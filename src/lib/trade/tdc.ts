// True TDC from piston-stop marks (common practice): turn the crank by hand each way onto a stop
// screwed into the plug hole and read the degree wheel or tape at both stops, a and b. TDC lies
// half-way between them: TDC = a + δ/2, δ the signed arc from a to b that passes TDC (the shorter
// one unless told otherwise), with δ/2 on each side. A spread measured as a distance s along the
// rim of diameter D is 360·s/(π·D) degrees (arc length s = r·θ).

export type Scale = 'signed' | 'full';
export type Arc = 'shorter' | 'longer';

/** An angle in the scale's own range: signed (−180, 180], full [0, 360). */
export function onScale(deg: number, scale: Scale): number {
	const full = ((deg % 360) + 360) % 360;
	if (scale === 'full') return full;
	return full > 180 ? full - 360 : full;
}

export interface TdcResult {
	tdcDeg: number;
	spreadDeg: number;
	halfSpreadDeg: number;
}

export type TdcAnswer = { ok: true; result: TdcResult } | { ok: false; field: string; message: string };

export function tdcFromMarks(a: number, b: number, scale: Scale, arc: Arc = 'shorter'): TdcAnswer {
	const range = scale === 'signed' ? [-180, 180] : [0, 360];
	for (const [field, v] of [['a', a], ['b', b]] as const) {
		if (!(v >= range[0]! && v <= range[1]!)) return { ok: false, field, message: `${field}: a reading from ${range[0]} to ${range[1]}° on a ${scale === 'signed' ? 'signed (−180 to 180)' : '0 to 360'} scale` };
	}
	let delta = onScale(b - a, 'signed');
	if (Math.abs(delta) < 1e-9) return { ok: false, field: 'b', message: 'b: must differ from a; a piston stop leaves one mark each side of TDC' };
	if (arc === 'longer') delta -= 360 * Math.sign(delta);
	const spread = Math.abs(delta);
	return { ok: true, result: { tdcDeg: round(onScale(a + delta / 2, scale)), spreadDeg: round(spread), halfSpreadDeg: round(spread / 2) } };
}

/** A spread measured along the rim: degrees, and the distance of TDC from either mark (s/2). */
export function spreadFromRim(distanceMm: number, diameterMm: number): { spreadDeg: number; halfSpreadDeg: number; fromEitherMarkMm: number } {
	const spread = (360 * distanceMm) / (Math.PI * diameterMm);
	return { spreadDeg: round(spread), halfSpreadDeg: round(spread / 2), fromEitherMarkMm: round(distanceMm / 2) };
}

const round = (x: number) => Math.round(x * 1e6) / 1e6;
