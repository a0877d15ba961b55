// One case as a POV-Ray scene (units: mm, y up, the bench or cover is the plane y = 0) and the
// 3D facts the truth needs: where the wheel's top face sits and what may hide part of the rim.
import { presentPositions, toothOutline, type WheelGeometry } from './wheel';
import { povCamera, povVec, type Camera, type Vec } from './camera';
import type { Rng } from './random';

export const MATERIALS = ['bright steel', 'aluminium', 'black oxide', 'gold anodised'] as const;
export const BACKGROUNDS = ['wooden bench', 'cutting mat', 'aluminium engine cover', 'grey painted cover'] as const;
export const LIGHTS = ['hard', 'soft', 'flash'] as const;
export type Material = (typeof MATERIALS)[number];
export type Background = (typeof BACKGROUNDS)[number];
export type Light = (typeof LIGHTS)[number];
export type Occluder = 'none' | 'finger' | 'bracket';

export interface SceneSpec {
	wheel: WheelGeometry;
	thickness: number;
	chamfer: number;
	boreR: number;
	keyway: boolean;
	holes: number;
	/** Height of the wheel's underside above the plane (0 on a bench, on a hub over a cover). */
	lift: number;
	material: Material;
	background: Background;
	light: Light;
	occluder: Occluder;
	/** Wheel angle (radians) where the occluder crosses the rim. */
	occluderRad: number;
	camera: Camera;
	/** A marker sphere at this point, to check the projection against the render. */
	marker?: Vec;
}

/** A capsule (segment and radius) or a box (centre, half sizes, turn about y): what may hide the rim. */
export type Blocker = { kind: 'capsule'; a: Vec; b: Vec; r: number } | { kind: 'box'; c: Vec; half: Vec; turnRad: number };

const f = (n: number) => n.toFixed(4);

function wheelTexture(m: Material): string {
	switch (m) {
		case 'bright steel':
			return `texture { pigment { rgb <0.60, 0.61, 0.63> } normal { onion 0.12 scale 0.35 }
	finish { ambient 0.03 diffuse 0.5 brilliance 2 specular 0.8 roughness 0.008 metallic reflection { 0.22 metallic } } }`;
		case 'aluminium':
			return `texture { pigment { rgb <0.80, 0.81, 0.82> } normal { bumps 0.08 scale <40, 0.05, 0.05> rotate y*30 }
	finish { ambient 0.04 diffuse 0.65 specular 0.45 roughness 0.03 metallic 0.5 reflection { 0.08 } } }`;
		case 'black oxide':
			return `texture { pigment { rgb <0.075, 0.075, 0.08> } normal { granite 0.05 scale 2 }
	finish { ambient 0.02 diffuse 0.6 specular 0.35 roughness 0.02 reflection { 0.04 } } }`;
		case 'gold anodised':
			return `texture { pigment { rgb <0.82, 0.6, 0.2> } normal { bumps 0.03 scale 0.3 }
	finish { ambient 0.03 diffuse 0.65 brilliance 1.5 specular 0.5 roughness 0.02 metallic reflection { 0.07 metallic } } }`;
	}
}

function prism(pts: [number, number][], y0: number, y1: number): string {
	return `prism { linear_sweep linear_spline ${f(y0)}, ${f(y1)}, ${pts.length + 1},
	${[...pts, pts[0]!].map(([x, z]) => `<${f(x)}, ${f(z)}>`).join(' ')} }`;
}

function wheelObject(s: SceneSpec): string {
	const t = s.thickness;
	const c = s.chamfer;
	const layers = 3;
	// A chamfer as thin steps, each inset a little more: at this size the steps read as one bevel.
	const steps = [{ inset: 0, y0: 0, y1: t - c }];
	for (let i = 1; i <= layers; i++)
		steps.push({ inset: (i * c) / layers, y0: t - c + ((i - 1) * c) / layers, y1: t - c + (i * c) / layers });
	const disc = steps.map((l) => `cylinder { <0, ${f(l.y0)}, 0>, <0, ${f(l.y1)}, 0>, ${f(s.wheel.rootR - l.inset)} }`);
	const cuts = [`cylinder { <0, -1, 0>, <0, ${f(t + 1)}, 0>, ${f(s.boreR)} }`];
	if (s.keyway)
		cuts.push(`box { <${f(s.boreR - 2)}, -1, ${f(-s.boreR * 0.18)}>, <${f(s.boreR * 1.25)}, ${f(t + 1)}, ${f(s.boreR * 0.18)}> }`);
	const holeR = (s.wheel.rootR - s.boreR) * 0.22;
	const holeAt = (s.wheel.rootR + s.boreR) / 2 - (s.wheel.rootR - s.boreR) * 0.05;
	for (let i = 0; i < s.holes; i++) {
		const a = (i * 2 * Math.PI) / s.holes + 0.3;
		cuts.push(
			`cylinder { <${f(holeAt * Math.cos(a))}, -1, ${f(holeAt * Math.sin(a))}>, <${f(holeAt * Math.cos(a))}, ${f(t + 1)}, ${f(holeAt * Math.sin(a))}>, ${f(holeR)} }`
		);
	}
	const tex = wheelTexture(s.material);
	const lift = `translate <0, ${f(s.lift)}, 0>`;
	// Each tooth its own top-level object: POV-Ray bounds them separately, where one prism with
	// every tooth in it would test all its edges for every ray.
	const teeth = presentPositions(s.wheel).map(
		(k) => `union { ${steps.map((l) => prism(toothOutline(s.wheel, k, l.inset), l.y0, l.y1)).join(' ')} ${tex} ${lift} }`
	);
	return `difference {
	union { ${disc.join(' ')} }
${cuts.map((p) => '\t' + p).join('\n')}
	${tex}
	${lift}
}
${teeth.join('\n')}`;
}

function hexBolt(x: number, z: number, y: number, across: number, h: number, tex: string): string {
	const r = across / Math.sqrt(3);
	const pts = Array.from({ length: 6 }, (_, i) => `<${f(r * Math.cos((i * Math.PI) / 3))}, ${f(r * Math.sin((i * Math.PI) / 3))}>`);
	return `prism { linear_sweep linear_spline 0, ${f(h)}, 7, ${pts.join(' ')} ${pts[0]} ${tex} rotate y*${f((x * 7 + z * 3) % 60)} translate <${f(x)}, ${f(y)}, ${f(z)}> }`;
}

const BOLT_TEX =
	'texture { pigment { rgb <0.45, 0.45, 0.47> } finish { diffuse 0.6 specular 0.4 roughness 0.03 metallic reflection 0.05 } }';

function backgroundObjects(s: SceneSpec, r: Rng): string {
	const out: string[] = [];
	switch (s.background) {
		case 'wooden bench': {
			out.push('plane { y, -4 pigment { rgb 0.03 } }');
			let x = -1500 + r.between(0, 100);
			const tone = r.between(0.7, 1.0);
			while (x < 1500) {
				const w = r.between(90, 150);
				const c1 = `rgb <${f(0.56 * tone)}, ${f(0.37 * tone)}, ${f(0.2 * tone)}>`;
				const c2 = `rgb <${f(0.68 * tone)}, ${f(0.47 * tone)}, ${f(0.27 * tone)}>`;
				const c3 = `rgb <${f(0.45 * tone)}, ${f(0.28 * tone)}, ${f(0.14 * tone)}>`;
				out.push(`box { <${f(x)}, -20, -1500>, <${f(x + w - 1.6)}, 0, 1500>
	texture { pigment { wood turbulence 0.07 color_map { [0 ${c1}] [0.45 ${c2}] [0.7 ${c1}] [1 ${c3}] } scale <${f(r.between(3, 7))}, ${f(r.between(3, 7))}, 300>
		translate <${f(r.between(-200, 200))}, ${f(r.between(-200, 200))}, 0> rotate y*${f(r.between(-1.5, 1.5))} translate x*${f(x + w / 2)} }
		normal { wood 0.15 scale <4, 4, 300> translate x*${f(x)} } finish { ambient 0.04 diffuse 0.72 specular 0.12 roughness 0.04 } }
}`);
				x += w;
			}
			break;
		}
		case 'cutting mat': {
			const grid = (axis: 'x' | 'z', period: number, width: number, tint: string) =>
				`texture { pigment { gradient ${axis} color_map { [0 rgbt <${tint}, 0>] [${f(width / period)} rgbt <${tint}, 0>] [${f(width / period)} rgbt 1] [1 rgbt 1] } scale ${f(period)} translate ${axis}*${f(r.between(0, period))} } finish { ambient 0.04 diffuse 0.7 } }`;
			const turn = r.between(-20, 20);
			out.push(`plane { y, 0
	texture { pigment { bozo color_map { [0 rgb <0.09, 0.34, 0.2>] [1 rgb <0.11, 0.38, 0.23>] } scale 30 } normal { granite 0.1 scale 3 } finish { ambient 0.04 diffuse 0.7 specular 0.1 roughness 0.05 } }
	${grid('x', 10, 0.35, '0.62, 0.82, 0.66')}
	${grid('z', 10, 0.35, '0.62, 0.82, 0.66')}
	${grid('x', 50, 0.8, '0.82, 0.92, 0.84')}
	${grid('z', 50, 0.8, '0.82, 0.92, 0.84')}
	rotate y*${f(turn)}
}`);
			// A few knife cuts, lighter scratches on the mat.
			for (let i = 0; i < 6; i++) {
				const a = r.between(0, 180);
				out.push(
					`box { <-${f(r.between(20, 120))}, -0.2, -0.15>, <${f(r.between(20, 120))}, 0.02, 0.15> pigment { rgb <0.4, 0.6, 0.45> } rotate y*${f(a)} translate <${f(r.between(-300, 300))}, 0, ${f(r.between(-300, 300))}> }`
				);
			}
			break;
		}
		case 'aluminium engine cover':
		case 'grey painted cover': {
			const alu = s.background === 'aluminium engine cover';
			const tex = alu
				? `texture { pigment { bozo color_map { [0 rgb <0.58, 0.58, 0.56>] [0.6 rgb <0.66, 0.66, 0.64>] [1 rgb <0.5, 0.49, 0.46>] } scale 25 }
		normal { granite 0.35 scale 1.5 } finish { ambient 0.04 diffuse 0.7 specular 0.3 roughness 0.06 metallic 0.4 reflection 0.04 } }`
				: `texture { pigment { bozo color_map { [0 rgb <0.4, 0.41, 0.42>] [0.7 rgb <0.44, 0.45, 0.46>] [1 rgb <0.34, 0.34, 0.34>] } scale 40 }
		normal { bumps 0.12 scale 0.8 } finish { ambient 0.04 diffuse 0.7 specular 0.25 roughness 0.03 } }`;
			out.push(`plane { y, 0 ${tex} }`);
			// Cast ribs and a sealing flange across the cover.
			const turn = r.between(0, 180);
			for (let i = 0; i < 3; i++) {
				const off = r.between(1.4, 3.5) * s.wheel.tipR * (i === 1 ? -1 : 1);
				out.push(`box { <-600, 0, ${f(off - 4)}>, <600, ${f(r.between(3, 7))}, ${f(off + 4)}> ${tex} rotate y*${f(turn)} }`);
			}
			for (let i = 0; i < 7; i++) {
				const a = r.between(0, 2 * Math.PI);
				const d = r.between(1.4, 3.2) * s.wheel.tipR;
				out.push(hexBolt(d * Math.cos(a), d * Math.sin(a), 0, 10, 6, BOLT_TEX));
			}
			// The crank nose through the bore, a washer and the pulley bolt on top.
			const top = s.lift + s.thickness;
			out.push(`cylinder { <0, 0, 0>, <0, ${f(s.lift)}, 0>, ${f(s.boreR * 1.6)} ${BOLT_TEX} }`);
			out.push(`cylinder { <0, 0, 0>, <0, ${f(top + 2)}, 0>, ${f(s.boreR * 0.97)} ${BOLT_TEX} }`);
			out.push(`cylinder { <0, ${f(top)}, 0>, <0, ${f(top + 2.5)}, 0>, ${f(s.boreR * 1.2)} ${BOLT_TEX} }`);
			out.push(hexBolt(0, 0, top + 2.5, s.boreR * 0.9, 8, BOLT_TEX));
			break;
		}
	}
	// Clutter round the wheel, kept low and clear of the rim.
	const n = Math.floor(r.between(2, 6));
	for (let i = 0; i < n; i++) {
		const a = r.between(0, 2 * Math.PI);
		const far = s.wheel.tipR * r.between(1.45, 2.6) + 15;
		const kind = r.pick(['bolt', 'washer', 'pencil', 'spanner'] as const);
		// However it is turned, a long object stays 12 mm clear of the rim.
		const reach = { bolt: 8, washer: 11, pencil: 49, spanner: 73 }[kind];
		const d = Math.max(far, s.wheel.tipR + reach + 12);
		const x = d * Math.cos(a);
		const z = d * Math.sin(a);
		if (kind === 'bolt') out.push(hexBolt(x, z, 0, 13, 8, BOLT_TEX));
		else if (kind === 'washer')
			out.push(
				`difference { cylinder { <0, 0, 0>, <0, 1.6, 0>, 11 } cylinder { <0, -1, 0>, <0, 3, 0>, 5.5 } ${BOLT_TEX} translate <${f(x)}, 0, ${f(z)}> }`
			);
		else if (kind === 'pencil')
			out.push(
				`cylinder { <-45, 3.5, 0>, <45, 3.5, 0>, 3.5 texture { pigment { rgb <0.85, 0.6, 0.1> } finish { diffuse 0.7 specular 0.3 } } rotate y*${f(r.between(0, 180))} translate <${f(x)}, 0, ${f(z)}> }`
			);
		else
			out.push(`union { box { <-60, 0, -6>, <60, 4, 6> } cylinder { <60, 0, 0>, <60, 4, 0>, 13 } cylinder { <-60, 0, 0>, <-60, 4, 0>, 11 }
	texture { pigment { rgb <0.7, 0.71, 0.73> } finish { diffuse 0.5 specular 0.7 roughness 0.01 metallic reflection 0.2 } } rotate y*${f(r.between(0, 180))} translate <${f(x)}, 0, ${f(z)}> }`);
	}
	return out.join('\n');
}

function lights(s: SceneSpec, r: Rng): string {
	const cam = s.camera.location;
	const sky = `sky_sphere { pigment { gradient y color_map { [0 rgb 0.25] [0.5 rgb 0.55] [0.8 rgb 0.85] [1 rgb 0.95] } } }`;
	const warm = r.between(0, 0.12);
	const colour = (k: number) => `rgb <${f(k * (1 + warm))}, ${f(k)}, ${f(k * (1 - warm))}>`;
	const el = r.between(35, 75) * (Math.PI / 180);
	const az = r.between(0, 2 * Math.PI);
	const dir: Vec = [Math.cos(el) * Math.cos(az), Math.sin(el), Math.cos(el) * Math.sin(az)];
	const at = (d: number) => povVec([dir[0] * d, dir[1] * d, dir[2] * d]);
	switch (s.light) {
		case 'hard':
			return `${sky}
light_source { ${at(1800)} color ${colour(r.between(0.8, 1.0))} }
light_source { ${povVec([-dir[0] * 1500, 1200, -dir[2] * 1500])} color ${colour(0.22)} shadowless }`;
		case 'soft':
			return `${sky}
light_source { ${at(1400)} color ${colour(r.between(0.7, 0.85))} area_light <500, 0, 0>, <0, 0, 500>, 4, 4 adaptive 1 circular orient jitter }
light_source { <0, 2500, 0> color ${colour(0.3)} shadowless }`;
		case 'flash':
			// A phone flash beside the lens, falling off with distance: bright middle, dim corners.
			return `sky_sphere { pigment { rgb 0.08 } }
light_source { ${povVec([cam[0] + 12, cam[1], cam[2] + 8])} color ${colour(r.between(1.2, 1.5))} fade_distance ${f(Math.hypot(...cam) * 0.8)} fade_power 2 }
light_source { <300, 2000, -500> color ${colour(0.12)} shadowless }`;
	}
}

function occluderObjects(s: SceneSpec, r: Rng): { pov: string; blockers: Blocker[] } {
	if (s.occluder === 'none') return { pov: '', blockers: [] };
	const a = s.occluderRad;
	const top = s.lift + s.thickness;
	const R = s.wheel.tipR;
	const radial: Vec = [Math.cos(a), 0, Math.sin(a)];
	const rot = (-a * 180) / Math.PI;
	if (s.occluder === 'finger') {
		// A fingertip resting on the face, reaching in over the rim from outside.
		const fr = r.between(7.5, 9.5);
		const inner = R - s.wheel.tipR * 0.12 - r.between(0, 6);
		const A: Vec = [radial[0] * inner, top + fr, radial[2] * inner];
		const far = R + 70;
		const B: Vec = [radial[0] * far, top + fr + 35, radial[2] * far];
		const skin = `texture { pigment { rgb <0.86, 0.62, 0.5> } normal { bumps 0.15 scale 0.6 } finish { ambient 0.06 diffuse 0.75 specular 0.12 roughness 0.06 } }`;
		return {
			pov: `merge { sphere { ${povVec(A)}, ${f(fr)} } cylinder { ${povVec(A)}, ${povVec(B)}, ${f(fr)} } sphere { ${povVec(B)}, ${f(fr)} } ${skin} }`,
			blockers: [{ kind: 'capsule', a: A, b: B, r: fr }]
		};
	}
	// A sensor bracket: a plate across the rim above the face with the sensor's body pointing down at it.
	const w = r.between(14, 20);
	const h = top + r.between(3, 8);
	const len = 55;
	const mid = R + 10;
	const c: Vec = [radial[0] * mid, h + 1.5, radial[2] * mid];
	const sensorAt: Vec = [radial[0] * (R - 3), 0, radial[2] * (R - 3)];
	const tex = `texture { pigment { rgb <0.5, 0.5, 0.52> } normal { bumps 0.1 scale 0.5 } finish { diffuse 0.6 specular 0.3 roughness 0.04 metallic } }`;
	const body = `texture { pigment { rgb 0.09 } finish { diffuse 0.6 specular 0.4 roughness 0.02 } }`;
	return {
		pov: `union {
	box { <${f(-len / 2)}, -1.5, ${f(-w)}>, <${f(len / 2)}, 1.5, ${f(w)}> ${tex} rotate y*${f(rot)} translate ${povVec(c)} }
	cylinder { <${f(sensorAt[0])}, ${f(h + 3)}, ${f(sensorAt[2])}>, <${f(sensorAt[0])}, ${f(h + 40)}, ${f(sensorAt[2])}>, 9 ${body} }
	cylinder { <${f(sensorAt[0])}, ${f(top + 1.5)}, ${f(sensorAt[2])}>, <${f(sensorAt[0])}, ${f(h + 3)}, ${f(sensorAt[2])}>, 6 ${tex} }
}`,
		blockers: [
			{ kind: 'box', c, half: [len / 2, 1.5, w], turnRad: a },
			{ kind: 'capsule', a: [sensorAt[0], top + 1.5, sensorAt[2]], b: [sensorAt[0], h + 40, sensorAt[2]], r: 9 }
		]
	};
}

export function sceneText(s: SceneSpec, r: Rng): { pov: string; blockers: Blocker[] } {
	const occ = occluderObjects(s, r);
	const marker = s.marker ? `sphere { ${povVec(s.marker)}, 1.2 pigment { rgb <1, 0, 1> } finish { ambient 1 diffuse 0 } no_shadow }` : '';
	const pov = `#version 3.7;
global_settings { assumed_gamma 1.0 max_trace_level 5 }
${povCamera(s.camera)}
${lights(s, r)}
${backgroundObjects(s, r)}
${wheelObject(s)}
${occ.pov}
${marker}
`;
	return { pov, blockers: occ.blockers };
}
