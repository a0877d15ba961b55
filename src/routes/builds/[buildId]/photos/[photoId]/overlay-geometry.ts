// What the photo page draws over the photo, as numbers: the tip ellipse as SVG path data, points and
// arcs on it at image angles, and which tooth numbers have room for a label. Pure (no DOM), so it is
// tested against the parametric ellipse. Image px, x right, y down; angles in degrees counter-
// clockwise from +x with y up, as the reading API gives them.
import { confidenceWord as fromValue } from '$lib/photo-confidence';
import type { Pt } from '$lib/schemas/photo';

/** The tip ellipse: centre, semi-axes a >= b, and the a-axis' direction. */
export interface Ellipse {
	cx: number;
	cy: number;
	a: number;
	b: number;
	angleDeg: number;
}

export interface ToothSeen extends Pt {
	/** 1 is the first tooth after the gap. */
	n: number;
}

export interface Unseen {
	fromDeg: number;
	toDeg: number;
}

export type ConfidenceWord = 'high' | 'medium' | 'low';

/** What a reading or a refusal may add for the overlay; each part only when it is well formed. */
export interface OverlayFacts {
	ellipse: Ellipse | null;
	teethAt: ToothSeen[];
	unseen: Unseen[];
	confidenceWord: ConfidenceWord | null;
	advice: string[];
}

const rad = (deg: number) => (deg * Math.PI) / 180;
const finite = (...v: unknown[]) => v.every((n) => typeof n === 'number' && Number.isFinite(n));
const f = (n: number) => (Math.round(n * 100) / 100).toString();

/** Unit vectors of the a- and b-axes on screen (y down). */
function axes(e: Ellipse) {
	const t = rad(e.angleDeg);
	return { u: { x: Math.cos(t), y: -Math.sin(t) }, v: { x: -Math.sin(t), y: -Math.cos(t) } };
}

/** The point at parameter `t` (radians) of the ellipse: centre + a cos t along a + b sin t along b. */
export function ellipsePoint(e: Ellipse, t: number): Pt {
	const { u, v } = axes(e);
	const p = e.a * Math.cos(t);
	const q = e.b * Math.sin(t);
	return { x: e.cx + p * u.x + q * v.x, y: e.cy + p * u.y + q * v.y };
}

/**
 * The whole ellipse as four quarter arcs (a half arc's centre is ill-conditioned: rounding its ends
 * moves it). SVG turns the x-axis clockwise on screen, hence the minus; the parameter runs
 * counter-clockwise on screen, SVG's sweep 0.
 */
export function ellipsePath(e: Ellipse): string {
	const [p0, ...rest] = [0, 1, 2, 3, 4].map((i) => ellipsePoint(e, (i * Math.PI) / 2));
	const arc = (to: Pt) => `A ${f(e.a)} ${f(e.b)} ${f(-e.angleDeg)} 0 0 ${f(to.x)} ${f(to.y)}`;
	return `M ${f(p0!.x)} ${f(p0!.y)} ${rest.map(arc).join(' ')} Z`;
}

/** Whether a point lies inside the ellipse. */
export function inside(e: Ellipse, p: Pt): boolean {
	const { u, v } = axes(e);
	const dx = p.x - e.cx;
	const dy = p.y - e.cy;
	return ((dx * u.x + dy * u.y) / e.a) ** 2 + ((dx * v.x + dy * v.y) / e.b) ** 2 < 1;
}

/**
 * Where a ray from `from` (inside the ellipse) at image angle `deg` meets the ellipse scaled by
 * `scale` about its centre: what "at this angle on the rim" means on a tilted photo.
 */
export function rimAt(e: Ellipse, from: Pt, deg: number, scale = 1): Pt {
	const { u, v } = axes(e);
	const d = { x: Math.cos(rad(deg)), y: -Math.sin(rad(deg)) };
	const a = e.a * scale;
	const b = e.b * scale;
	// In the ellipse's own frame: (px + s dx)^2/a^2 + (py + s dy)^2/b^2 = 1, the larger root.
	const px = (from.x - e.cx) * u.x + (from.y - e.cy) * u.y;
	const py = (from.x - e.cx) * v.x + (from.y - e.cy) * v.y;
	const dx = d.x * u.x + d.y * u.y;
	const dy = d.x * v.x + d.y * v.y;
	const A = dx ** 2 / a ** 2 + dy ** 2 / b ** 2;
	const B = 2 * ((px * dx) / a ** 2 + (py * dy) / b ** 2);
	const C = px ** 2 / a ** 2 + py ** 2 / b ** 2 - 1;
	const s = (-B + Math.sqrt(Math.max(0, B * B - 4 * A * C))) / (2 * A);
	return { x: from.x + s * d.x, y: from.y + s * d.y };
}

/** Counter-clockwise from `fromDeg` to `toDeg` (y up), in (0, 360]. */
export function spanDeg(fromDeg: number, toDeg: number): number {
	const s = (((toDeg - fromDeg) % 360) + 360) % 360;
	return s === 0 ? 360 : s;
}

/** An open polyline along the (scaled) ellipse, counter-clockwise from one image angle to another, a point every 2° or less. */
export function rimArc(e: Ellipse, from: Pt, fromDeg: number, toDeg: number, scale = 1): string {
	const span = spanDeg(fromDeg, toDeg);
	const steps = Math.max(2, Math.ceil(span / 2));
	const pts = Array.from({ length: steps + 1 }, (_, i) => rimAt(e, from, fromDeg + (span * i) / steps, scale));
	return pts.map((p, i) => `${i ? 'L' : 'M'} ${f(p.x)} ${f(p.y)}`).join(' ');
}

/** The tapped centre when it lies inside the ellipse (angles are read about it), else the ellipse's own centre. */
export function angleOrigin(e: Ellipse, centre: Pt | null): Pt {
	return centre && inside(e, centre) ? centre : { x: e.cx, y: e.cy };
}

/** A circle as an ellipse, for readings that give only a radius about the tapped centre. */
export const circle = (c: Pt, r: number): Ellipse => ({ cx: c.x, cy: c.y, a: r, b: r, angleDeg: 0 });

/** Steps tried for tooth labels: every tooth, then every 5th, then coarser; tooth 1 is always labelled. */
const labelSteps = [1, 5, 10, 20, 30, 60, 120, 360];

/**
 * The tooth numbers to label: every tooth when neighbouring labels are at least `roomPx` apart on
 * screen, else every 5th (then 10th, …) plus tooth 1, the first after the gap. `screenPerImagePx`
 * is how many screen px one image px is shown as.
 */
export function labelledTeeth(teeth: readonly ToothSeen[], screenPerImagePx: number, roomPx: number): Set<number> {
	const sorted = [...teeth].sort((p, q) => p.n - q.n);
	for (const step of labelSteps) {
		const chosen = sorted.filter((t) => t.n === 1 || t.n % step === 0);
		if (chosen.length < 2 || fits(chosen, screenPerImagePx, roomPx)) return new Set(chosen.map((t) => t.n));
	}
	return new Set(sorted.filter((t) => t.n === 1).map((t) => t.n));
}

function fits(chosen: ToothSeen[], scale: number, room: number): boolean {
	return chosen.every((t, i) => {
		const next = chosen[(i + 1) % chosen.length]!;
		return Math.hypot(next.x - t.x, next.y - t.y) * scale >= room;
	});
}

/** `p` moved `by` image px away from `from` (a label just outside its tooth). */
export function outward(from: Pt, p: Pt, by: number): Pt {
	const d = Math.hypot(p.x - from.x, p.y - from.y) || 1;
	return { x: p.x + ((p.x - from.x) / d) * by, y: p.y + ((p.y - from.y) / d) * by };
}

/** Kept within `[0, w] x [0, h]`. */
export const clampTo = (p: Pt, w: number, h: number): Pt => ({ x: Math.min(w, Math.max(0, p.x)), y: Math.min(h, Math.max(0, p.y)) });

function ellipseOf(x: unknown): Ellipse | null {
	if (typeof x !== 'object' || x === null) return null;
	const e = x as Ellipse;
	if (!finite(e.cx, e.cy, e.a, e.b, e.angleDeg) || !(e.a > 0) || !(e.b > 0)) return null;
	// a >= b is agreed; an answer with them swapped is the same ellipse turned a quarter.
	return e.a >= e.b ? { cx: e.cx, cy: e.cy, a: e.a, b: e.b, angleDeg: e.angleDeg } : { ...e, a: e.b, b: e.a, angleDeg: e.angleDeg + 90 };
}

const list = (x: unknown): unknown[] => (Array.isArray(x) ? x : []);

/**
 * The overlay's facts from a reading or a refusal body, tolerating their absence (readers before
 * issue 17 give none of them) and dropping what is malformed rather than drawing nonsense.
 */
export function overlayFacts(answer: unknown): OverlayFacts {
	const a = (typeof answer === 'object' && answer !== null ? answer : {}) as Record<string, unknown>;
	const word = a.confidenceWord;
	return {
		ellipse: ellipseOf(a.ellipse),
		teethAt: list(a.teethAt).filter((t): t is ToothSeen => {
			const p = t as ToothSeen;
			return typeof t === 'object' && t !== null && finite(p.x, p.y) && Number.isInteger(p.n) && p.n >= 1;
		}),
		unseen: list(a.unseen).filter(
			(s): s is Unseen => typeof s === 'object' && s !== null && finite((s as Unseen).fromDeg, (s as Unseen).toDeg)
		),
		confidenceWord: word === 'high' || word === 'medium' || word === 'low' ? word : null,
		advice: list(a.advice).filter((s): s is string => typeof s === 'string' && s.trim() !== '')
	};
}

/** The confidence in words: the reader's own word when it gives one, else from the number. */
export function confidenceWord(word: ConfidenceWord | null | undefined, value: number | undefined): ConfidenceWord | null {
	if (word) return word;
	if (typeof value !== 'number') return null;
	return fromValue(value);
}
