// Circle pose from its image: a circle placed in front of a pinhole camera by hand (rotation about
// two axes, a distance), projected with the pinhole equations (x = f X / Z + px), must come back
// from its ellipse alone with its centre where the camera put it; the expected values come from
// the projection written here, not from plane.ts.
import { describe, expect, it } from 'vitest';
import { conicEllipse, ellipseConic, ellipseError, fitConic } from './conic';
import { affinePose, circlePoses, mapPoint, unmapPoint, type Camera } from './plane';

const cam: Camera = { f: 3200, px: 2000, py: 1500 };

function project(tiltDeg: number, axisDeg: number, dist: number, off: [number, number], radius: number) {
	const t = (tiltDeg * Math.PI) / 180;
	const ax = (axisDeg * Math.PI) / 180;
	// Plane axes: rotate (1,0,0), (0,1,0) by the tilt about an in-image axis at axisDeg.
	const k = [Math.cos(ax), Math.sin(ax), 0];
	const rot = (v: number[]) => {
		// Rodrigues' rotation of v about k by t.
		const c = Math.cos(t);
		const s = Math.sin(t);
		const kv = k[0]! * v[0]! + k[1]! * v[1]! + k[2]! * v[2]!;
		const kx = [k[1]! * v[2]! - k[2]! * v[1]!, k[2]! * v[0]! - k[0]! * v[2]!, k[0]! * v[1]! - k[1]! * v[0]!];
		return v.map((vi, i) => vi * c + kx[i]! * s + k[i]! * kv * (1 - c));
	};
	const e1 = rot([1, 0, 0]);
	// v up in the photo, as the unit frame has it, so angles run ccw in both.
	const e2 = rot([0, -1, 0]);
	const centre = [off[0], off[1], dist];
	const at = (phi: number) => {
		const P = [0, 1, 2].map((i) => centre[i]! + radius * (Math.cos(phi) * e1[i]! + Math.sin(phi) * e2[i]!));
		return { x: (cam.f * P[0]!) / P[2]! + cam.px, y: (cam.f * P[1]!) / P[2]! + cam.py };
	};
	const c = { x: (cam.f * off[0]) / dist + cam.px, y: (cam.f * off[1]) / dist + cam.py };
	return { at, centre: c };
}

describe('conic fit', () => {
	it('gives back an ellipse drawn from its centre, axes and angle', () => {
		const el = { cx: 700, cy: 420, a: 300, b: 210, angleDeg: 30 };
		const q = ellipseConic(el);
		const pts = Array.from({ length: 9 }, (_, i) => {
			const phi = (2 * Math.PI * i) / 9;
			const t = (30 * Math.PI) / 180;
			const u = 300 * Math.cos(phi);
			const v = 210 * Math.sin(phi);
			return { x: 700 + u * Math.cos(t) - v * Math.sin(t), y: 420 - (u * Math.sin(t) + v * Math.cos(t)) };
		});
		const back = conicEllipse(fitConic(pts)!)!;
		expect(back.cx).toBeCloseTo(700, 6);
		expect(back.cy).toBeCloseTo(420, 6);
		expect(back.a).toBeCloseTo(300, 6);
		expect(back.b).toBeCloseTo(210, 6);
		expect(back.angleDeg).toBeCloseTo(30, 6);
		expect(conicEllipse(q)!.angleDeg).toBeCloseTo(30, 6);
		for (const p of pts) expect(Math.abs(ellipseError(back, p))).toBeLessThan(1e-9);
	});

	it('reads a conic scaled by a negative number as the same ellipse, long axis first', () => {
		// The same ellipse as above; an eigenvector's sign is arbitrary, so a fit can come out negated.
		const q = ellipseConic({ cx: 700, cy: 420, a: 300, b: 210, angleDeg: 30 });
		const back = conicEllipse(q.map((v) => -2 * v) as typeof q)!;
		expect(back.a).toBeCloseTo(300, 6);
		expect(back.b).toBeCloseTo(210, 6);
		expect(back.angleDeg).toBeCloseTo(30, 6);
		expect(back.cx).toBeCloseTo(700, 6);
	});
});

describe('circle pose', () => {
	it.each([
		[30, 20, 5, [-0.3, 0.2]],
		[35, 110, 4, [0.5, 0.4]],
		[15, 250, 6, [0.1, -0.6]],
		[0.5, 0, 5, [0, 0]]
	] as const)('tilt %d° about %d°: one pose puts the centre where the camera did', (tilt, axis, dist, off) => {
		const shot = project(tilt, axis, dist, [off[0], off[1]], 1);
		const tips = Array.from({ length: 7 }, (_, i) => shot.at(0.4 + (2 * Math.PI * i) / 7));
		const poses = circlePoses(fitConic(tips)!, cam);
		expect(poses.length).toBeGreaterThan(0);
		const misses = poses.map((h) => {
			const c = mapPoint(h, 0, 0);
			return Math.hypot(c.x - shot.centre.x, c.y - shot.centre.y);
		});
		expect(Math.min(...misses)).toBeLessThan(0.05);
		// Every pose maps the unit circle onto the ellipse, and back.
		for (const h of poses)
			for (const p of tips) {
				const u = unmapPoint(h, p);
				expect(Math.hypot(u.x, u.y)).toBeCloseTo(1, 6);
			}
		// The right pose keeps equal angles equal: tips 1/7 turn apart in the plane stay 1/7 apart.
		const best = poses[misses.indexOf(Math.min(...misses))]!;
		const ang = tips.map((p) => {
			const u = unmapPoint(best, p);
			return Math.atan2(u.y, u.x);
		});
		for (let i = 1; i < ang.length; i++) {
			const d = (((ang[i]! - ang[i - 1]!) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
			expect(d).toBeCloseTo((2 * Math.PI) / 7, 6);
		}
	});

	it('a 7° tilt leaves the ellipse over 0.985 round, yet only a circle pose keeps equal angles equal', () => {
		// A phone shot: the wheel half the focal length across, a little off the image's middle.
		const shot = project(7, 60, 4, [0.3, -0.2], 1);
		const tips = Array.from({ length: 12 }, (_, i) => shot.at((2 * Math.PI * i) / 12));
		const q = fitConic(tips)!;
		const el = conicEllipse(q)!;
		expect(el.b / el.a).toBeGreaterThan(0.985);
		// Angles between neighbouring tips 30° apart in the plane, as each pose reads them.
		const worst = (h: ReturnType<typeof affinePose>) => {
			const ang = tips.map((p) => {
				const u = unmapPoint(h, p);
				return Math.atan2(u.y, u.x);
			});
			return Math.max(
				...ang.map((a, i) => {
					const d = (((ang[(i + 1) % ang.length]! - a) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
					return Math.abs((d * 180) / Math.PI - 30);
				})
			);
		};
		// The plain stretch: a 60-2's pitch is 6°, so half a degree off per 30° adds up round the ring.
		expect(worst(affinePose(el.cx, el.cy, el.a, el.b, el.angleDeg))).toBeGreaterThan(0.5);
		expect(Math.min(...circlePoses(q, cam).map(worst))).toBeLessThan(0.01);
	});
});
