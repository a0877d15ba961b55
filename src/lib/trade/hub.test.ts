// The convention against a 3D model of the engine written here from vectors (geometry of a rigid
// rotation), not from hub.ts: the viewer stands on the wheel side on +z looking toward the engine
// (−z); the tape lies on the rim with its top edge toward the engine.
import { describe, expect, it } from 'vitest';
import { atdcSide, btdcSide, faceClockwiseDeg, tapeOffsetDeg, tapeTravel } from './hub';

type V = [number, number, number];
const cross = (a: V, b: V): V => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const dot = (a: V, b: V) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const rad = (d: number) => (d * Math.PI) / 180;

/** Angular velocity of the crank: clockwise seen from +z is a rotation about −z. */
const omega = (rotation: 'cw' | 'ccw'): V => (rotation === 'cw' ? [0, 0, -1] : [0, 0, 1]);

/** At the rim point at polar angle a (from +x, anticlockwise seen from +z): the tape's own right. */
function tapeRight(a: number): V {
	const normal: V = [Math.cos(a), Math.sin(a), 0];
	const up: V = [0, 0, -1]; // top edge toward the engine
	return cross(up, normal); // a page facing its reader: right = up × normal
}

describe('tape travel past the pointer (rigid rotation, 3D model)', () => {
	for (const rotation of ['cw', 'ccw'] as const) {
		it(`${rotation}: the rim moves toward the tape's ${rotation === 'cw' ? 'right' : 'left'} at every pointer position`, () => {
			for (let deg = 0; deg < 360; deg += 15) {
				const a = rad(deg);
				const velocity = cross(omega(rotation), [Math.cos(a), Math.sin(a), 0]);
				expect(Math.sign(dot(velocity, tapeRight(a)))).toBe(tapeTravel(rotation));
			}
		});
	}

	it('the point under the pointer θ before TDC lies θ ahead of 0 and reads as the BTDC side', () => {
		for (const rotation of ['cw', 'ccw'] as const) {
			for (const theta of [5, 10, 37.5]) {
				// Pointer at the top of the hub (polar 90°). Crank θ before TDC: the hub still has θ to turn.
				const sense = rotation === 'cw' ? -1 : 1; // polar angle change per degree of crank rotation
				const zeroPolar = 90 - sense * theta; // where the tape's 0 is now
				// Walk along the tape from 0 toward its right until reaching the pointer.
				const right = tapeRight(rad(90));
				const stepRightPolar = Math.sign(dot(cross([0, 0, 1], [Math.cos(rad(zeroPolar)), Math.sin(rad(zeroPolar)), 0]), right)); // +1: rightward is anticlockwise
				const polarToPointer = 90 - zeroPolar;
				const offsetRight = polarToPointer * stepRightPolar;
				expect(offsetRight).toBeCloseTo(tapeOffsetDeg(rotation, -theta), 9);
				expect(offsetRight > 0 ? 'right' : 'left').toBe(btdcSide(rotation));
				expect(offsetRight > 0 ? 'left' : 'right').toBe(atdcSide(rotation));
			}
		}
	});

	it('on the hub face BTDC lies ahead of 0 in the sense of rotation', () => {
		expect(faceClockwiseDeg('cw', -10)).toBe(10); // clockwise crank: 10 BTDC is 10° clockwise of 0
		expect(faceClockwiseDeg('ccw', -10)).toBe(-10);
	});
});
