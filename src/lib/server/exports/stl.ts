// The wheel as a binary STL, for a 3D-printed test-fit copy: the cut contours (the same drawing the
// DXF and SVG write) made into polygons, the face triangulated with earcut, and the walls extruded
// to the plate's thickness. Always millimetres: STL carries no units, and slicers read mm.
import earcut from 'earcut';
import { sweepDeg, type Contour, type Point, type Segment } from '$lib/trade/geometry';
import { rad } from '$lib/trade/units';
import { cutContours, drawWheel, type WheelSpec } from '$lib/trade/wheel';

/**
 * How finely arcs are cut into chords: at most 0.01 mm from the true arc, and at most 3° a chord,
 * so that no arc, however small, loses more than 0.05 % of its area (1 − sin x / x for a 3° chord).
 * An arc that whole lies within 0.01 mm of its chord (a corner radius of a few microns) is the chord.
 */
const chordToleranceMm = 0.01;
const maxStepDeg = 3;
const minStepDeg = 0.25;

const f32 = Math.fround;

function stepsFor(radius: number, sweep: number): number {
	if (radius * (1 - Math.cos(rad(Math.min(sweep, 180)) / 2)) <= chordToleranceMm && sweep <= 180) return 1;
	const byTolerance = radius > chordToleranceMm ? (2 * Math.acos(1 - chordToleranceMm / radius) * 180) / Math.PI : maxStepDeg;
	const step = Math.min(maxStepDeg, Math.max(minStepDeg, byTolerance));
	return Math.max(1, Math.ceil(sweep / step));
}

/** A segment's points from its start up to, not including, its end (the next segment starts there). */
function segmentPoints(s: Segment): Point[] {
	if (s.kind === 'line') return [s.from];
	const sweep = sweepDeg(s);
	const n = stepsFor(s.radius, sweep);
	const pts = [s.from];
	const dir = s.ccw ? 1 : -1;
	for (let i = 1; i < n; i++) {
		const a = rad(s.startDeg + (dir * sweep * i) / n);
		pts.push({ x: s.center.x + s.radius * Math.cos(a), y: s.center.y + s.radius * Math.sin(a) });
	}
	return pts;
}

/**
 * A circle's points, half a step off the axes: a point on a round angle would lie on the same ray
 * as a tooth flank there, and earcut could join the three into a facet of no area.
 */
function circlePoints(center: Point, radius: number): Point[] {
	const n = Math.max(8, stepsFor(radius, 360));
	return Array.from({ length: n }, (_, i) => {
		const a = (2 * Math.PI * (i + 0.5)) / n;
		return { x: center.x + radius * Math.cos(a), y: center.y + radius * Math.sin(a) };
	});
}

/**
 * Points exactly on the line through their neighbours go: earcut leaves such a point out of the
 * face (its own test, the same sum in doubles), and a wall edge ending there would then meet no
 * face edge, leaving the part open.
 */
function dropCollinear(ring: Point[]) {
	for (let changed = true; changed && ring.length > 3;) {
		changed = false;
		for (let i = 0; i < ring.length && ring.length > 3;) {
			const p = ring[(i + ring.length - 1) % ring.length]!;
			const q = ring[i]!;
			const r = ring[(i + 1) % ring.length]!;
			const equal = (a: Point, b: Point) => a.x === b.x && a.y === b.y;
			if (equal(q, r) || (q.y - p.y) * (r.x - q.x) - (q.x - p.x) * (r.y - q.y) === 0) {
				ring.splice(i, 1);
				changed = true;
			} else i++;
		}
	}
}

const signedArea = (ring: Point[]) =>
	ring.reduce((a, p, i) => a + (p.x * ring[(i + 1) % ring.length]!.y - ring[(i + 1) % ring.length]!.x * p.y) / 2, 0);

/**
 * A contour as a ring of points in float32 (what the file holds, so that the faces and the walls
 * share each vertex exactly), without repeats, turned counter-clockwise (`ccw`) or clockwise.
 */
export function ringOf(c: Contour, ccw: boolean): Point[] {
	const raw = c.kind === 'circle' ? circlePoints(c.center, c.radius) : c.segments.flatMap(segmentPoints);
	const ring: Point[] = [];
	for (const p of raw) {
		const q = { x: f32(p.x), y: f32(p.y) };
		const last = ring.at(-1);
		if (!last || last.x !== q.x || last.y !== q.y) ring.push(q);
	}
	while (ring.length > 1 && ring[0]!.x === ring.at(-1)!.x && ring[0]!.y === ring.at(-1)!.y) ring.pop();
	dropCollinear(ring);
	return signedArea(ring) > 0 === ccw ? ring : ring.reverse();
}

export interface Mesh {
	/** x, y, z per vertex, mm. */
	vertices: number[];
	/** Three vertex indices per triangle, counter-clockwise seen from outside the part. */
	triangles: number[];
}

/** The part: the outer ring counter-clockwise, the bore and holes clockwise, faces at z = 0 and z = thickness. */
export function wheelMesh(spec: WheelSpec): Mesh {
	const [outer, ...inner] = cutContours(drawWheel(spec));
	const rings = [ringOf(outer!, true), ...inner.map((c) => ringOf(c, false))];
	const flat: number[] = [];
	const holeStarts: number[] = [];
	for (const [i, ring] of rings.entries()) {
		if (i > 0) holeStarts.push(flat.length / 2);
		for (const p of ring) flat.push(p.x, p.y);
	}
	const n = flat.length / 2;
	const t = f32(spec.thicknessMm);
	const vertices: number[] = [];
	for (let i = 0; i < n; i++) vertices.push(flat[2 * i]!, flat[2 * i + 1]!, 0);
	for (let i = 0; i < n; i++) vertices.push(flat[2 * i]!, flat[2 * i + 1]!, t);
	const triangles: number[] = [];
	const face = earcut(flat, holeStarts, 2);
	for (let i = 0; i < face.length; i += 3) {
		const [a, b, c] = [face[i]!, face[i + 1]!, face[i + 2]!];
		// earcut's triangles turn the way the outer ring does only by chance: orient each one.
		const ccw =
			(flat[2 * b]! - flat[2 * a]!) * (flat[2 * c + 1]! - flat[2 * a + 1]!) -
				(flat[2 * c]! - flat[2 * a]!) * (flat[2 * b + 1]! - flat[2 * a + 1]!) >
			0;
		const [p, q] = ccw ? [b, c] : [c, b];
		triangles.push(a + n, p + n, q + n); // top, facing +z
		triangles.push(a, q, p); // bottom, facing −z
	}
	let start = 0;
	for (const ring of rings) {
		// Walking a ring with the part on the left, (edge × z) points out of the part.
		for (let i = 0; i < ring.length; i++) {
			const a = start + i;
			const b = start + ((i + 1) % ring.length);
			triangles.push(a, b, b + n, a, b + n, a + n);
		}
		start += ring.length;
	}
	return { vertices, triangles };
}

/** Binary STL (80-byte header, facet count, 50 bytes a facet: normal, three vertices, attribute). */
export function meshStl(mesh: Mesh, title: string): Buffer {
	const count = mesh.triangles.length / 3;
	const out = Buffer.alloc(84 + 50 * count);
	// A binary file's header must not begin with "solid" (readers would take it for ASCII STL).
	out.write(`Phasewright ${title}`.slice(0, 80), 0, 'ascii');
	out.writeUInt32LE(count, 80);
	const v = mesh.vertices;
	for (let f = 0; f < count; f++) {
		const [a, b, c] = [3 * mesh.triangles[3 * f]!, 3 * mesh.triangles[3 * f + 1]!, 3 * mesh.triangles[3 * f + 2]!];
		const u = [v[b]! - v[a]!, v[b + 1]! - v[a + 1]!, v[b + 2]! - v[a + 2]!];
		const w = [v[c]! - v[a]!, v[c + 1]! - v[a + 1]!, v[c + 2]! - v[a + 2]!];
		const nx = u[1]! * w[2]! - u[2]! * w[1]!;
		const ny = u[2]! * w[0]! - u[0]! * w[2]!;
		const nz = u[0]! * w[1]! - u[1]! * w[0]!;
		const len = Math.hypot(nx, ny, nz) || 1;
		let at = 84 + 50 * f;
		for (const x of [nx / len, ny / len, nz / len, v[a]!, v[a + 1]!, v[a + 2]!, v[b]!, v[b + 1]!, v[b + 2]!, v[c]!, v[c + 1]!, v[c + 2]!]) {
			out.writeFloatLE(x, at);
			at += 4;
		}
	}
	return out;
}

export const wheelStl = (spec: WheelSpec, title: string): Buffer => meshStl(wheelMesh(spec), title);
