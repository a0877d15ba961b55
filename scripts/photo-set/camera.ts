// The camera both POV-Ray and the truth use. POV-Ray's perspective camera shoots the ray
// direction + u*right + v*up for the pixel at u, v in -0.5..0.5 (u to the right, v up), so the same
// explicit vectors written into the scene project a 3D point back to the pixel it lands on.
export type Vec = [number, number, number];

export const add = (a: Vec, b: Vec): Vec => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const sub = (a: Vec, b: Vec): Vec => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const scale = (a: Vec, s: number): Vec => [a[0] * s, a[1] * s, a[2] * s];
export const dot = (a: Vec, b: Vec) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a: Vec, b: Vec): Vec => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const unit = (a: Vec): Vec => scale(a, 1 / Math.hypot(...a));

export interface Camera {
	location: Vec;
	/** Scaled so its length is the focal length in units of the image height. */
	direction: Vec;
	/** Length width/height. */
	right: Vec;
	/** Length 1. */
	up: Vec;
	width: number;
	height: number;
}

/**
 * A camera looking at `target` from `distance`, tilted `tiltDeg` from straight down (world y is
 * up), from the side `azimuthDeg`, rolled `rollDeg` about its own axis, with a vertical field of view.
 */
export function makeCamera(o: {
	target: Vec;
	distance: number;
	tiltDeg: number;
	azimuthDeg: number;
	rollDeg: number;
	vfovDeg: number;
	width: number;
	height: number;
}): Camera {
	const t = (o.tiltDeg * Math.PI) / 180;
	const az = (o.azimuthDeg * Math.PI) / 180;
	const location = add(o.target, scale([Math.sin(t) * Math.cos(az), Math.cos(t), Math.sin(t) * Math.sin(az)], o.distance));
	const d = unit(sub(o.target, location));
	// Image "up" starts as the horizontal direction away from the camera, so a tilted shot looks
	// across the bench the way a person holds a phone.
	const away: Vec = [-Math.cos(az), 0, -Math.sin(az)];
	let u0 = unit(sub(away, scale(d, dot(away, d))));
	// POV-Ray's default camera has right = up x direction (x = y x z); keeping that avoids a mirror.
	let r0 = cross(u0, d);
	const roll = (o.rollDeg * Math.PI) / 180;
	const r = add(scale(r0, Math.cos(roll)), scale(u0, Math.sin(roll)));
	const u = add(scale(u0, Math.cos(roll)), scale(r0, -Math.sin(roll)));
	u0 = u;
	r0 = r;
	const focal = 0.5 / Math.tan((o.vfovDeg * Math.PI) / 360);
	return {
		location,
		direction: scale(d, focal),
		right: scale(unit(r0), o.width / o.height),
		up: unit(u0),
		width: o.width,
		height: o.height
	};
}

/** Image pixel (x right, y down, 0..width, 0..height) where the point lands. */
export function project(cam: Camera, p: Vec): { x: number; y: number; depth: number } {
	const d = sub(p, cam.location);
	const t = dot(d, cam.direction) / dot(cam.direction, cam.direction);
	const u = dot(d, cam.right) / dot(cam.right, cam.right) / t;
	const v = dot(d, cam.up) / dot(cam.up, cam.up) / t;
	return { x: (u + 0.5) * cam.width, y: (0.5 - v) * cam.height, depth: t };
}

export const povVec = (v: Vec) => `<${v.map((c) => c.toFixed(6)).join(', ')}>`;

export function povCamera(cam: Camera): string {
	return `camera {
	perspective
	location ${povVec(cam.location)}
	direction ${povVec(cam.direction)}
	right ${povVec(cam.right)}
	up ${povVec(cam.up)}
}`;
}
