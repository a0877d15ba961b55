// Renders the photo test set: `npx tsx scripts/photo-set/generate.ts [--out DIR] [--only t01,c03]
// [--check] [--reuse DIR]`. Needs POV-Ray (Debian `povray`) on the PATH; only for regenerating, never in CI.
// Each case: a .pov scene, a POV-Ray render, phone-like post-processing (blur, vignetting, noise,
// JPEG) and the truth JSON, projected through the same camera the scene uses.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import sharp from 'sharp';
import { add, dot, makeCamera, project, sub, type Camera, type Vec } from './camera';
import { CALIBRATION_CASES, TEST_CASES, type CaseDef } from './cases';
import { rng, type Rng } from './random';
import { sceneText, type Blocker, type SceneSpec } from './scene';
import { positionRad, type WheelGeometry } from './wheel';

const DEFAULT_OUT = resolve(import.meta.dirname, '../../tests/fixtures/photo-set');

interface Truth {
	file: string;
	teeth: number;
	missing: number;
	gaps: { first: number; count: number }[];
	gapAngleDeg: number;
	centre: { x: number; y: number };
	tips: { x: number; y: number }[];
	/** Pattern position (0 = first tooth after the gap, clockwise as photographed) of each tip. */
	tipPositions: number[];
	material: string;
	background: string;
	light: string;
	tiltDeg: number;
	rollDeg: number;
	occluded: boolean;
	occluder: string;
	seed: number;
	width: number;
	height: number;
	odMm: number;
	/** Wheel's projected width across the image's shorter side. */
	fill: number;
}

const round = (n: number, d = 1) => Math.round(n * 10 ** d) / 10 ** d;
const imageAngle = (p: { x: number; y: number }, c: { x: number; y: number }) =>
	((((Math.atan2(-(p.y - c.y), p.x - c.x) * 180) / Math.PI) % 360) + 360) % 360;

function segmentDistance(p0: Vec, p1: Vec, q0: Vec, q1: Vec): number {
	// Closest approach of two segments, sampled finely: exact enough for a 3 mm margin.
	let best = Infinity;
	const steps = 400;
	const d = sub(q1, q0);
	const dd = dot(d, d);
	for (let i = 0; i <= steps; i++) {
		const p = add(p0, sub(p1, p0).map((c) => (c * i) / steps) as Vec);
		const t = Math.max(0, Math.min(1, dot(sub(p, q0), d) / dd));
		const q = add(q0, d.map((c) => c * t) as Vec);
		best = Math.min(best, Math.hypot(...sub(p, q)));
	}
	return best;
}

function hidden(cam: Camera, p: Vec, blockers: Blocker[], margin: number): boolean {
	return blockers.some((b) => {
		if (b.kind === 'capsule') return segmentDistance(cam.location, p, b.a, b.b) < b.r + margin;
		const ex: Vec = [Math.cos(b.turnRad), 0, Math.sin(b.turnRad)];
		const ez: Vec = [-Math.sin(b.turnRad), 0, Math.cos(b.turnRad)];
		const local = (v: Vec): Vec => {
			const d = sub(v, b.c);
			return [dot(d, ex), d[1], dot(d, ez)];
		};
		const o = local(cam.location);
		const e = local(p);
		let t0 = 0;
		let t1 = 1;
		for (let k = 0; k < 3; k++) {
			const ok = o[k]!;
			const dir = e[k]! - ok;
			const h = b.half[k]! + margin;
			if (Math.abs(dir) < 1e-9) {
				if (Math.abs(ok) > h) return false;
				continue;
			}
			let a = (-h - ok) / dir;
			let c = (h - ok) / dir;
			if (a > c) [a, c] = [c, a];
			t0 = Math.max(t0, a);
			t1 = Math.min(t1, c);
		}
		return t0 <= t1;
	});
}

function buildSpec(c: CaseDef, r: Rng) {
	const od = r.between(90, 180);
	const tipR = od / 2;
	const pitchArc = (Math.PI * od) / c.teeth;
	const depth = Math.min(9, Math.max(3, pitchArc * r.between(0.45, 0.6)));
	const duty = c.teeth <= 8 ? r.between(0.2, 0.4) : r.between(0.4, 0.6);
	const wheel: WheelGeometry = { teeth: c.teeth, missing: c.missing, tipR, rootR: tipR - depth, duty, startRad: r.between(0, 2 * Math.PI) };
	const thickness = r.between(3, 6);
	const onEngine = c.background.includes('cover');
	const lift = onEngine ? r.between(12, 30) : 0;
	const boreR = (tipR - depth) * r.between(0.2, 0.32);
	const holes = c.teeth >= 12 && r.next() < 0.5 ? r.pick([3, 4, 5, 6]) : 0;
	const keyway = r.next() < 0.5;
	const tiltDeg = r.between(0, 35);
	const rollDeg = r.between(-40, 40);
	const azimuthDeg = r.between(0, 360);
	const fill = r.between(0.3, 0.7);
	const longFov = r.between(60, 68);
	const landscape = c.width >= c.height;
	const vfovDeg = landscape ? (2 * Math.atan(Math.tan((longFov * Math.PI) / 360) * (c.height / c.width)) * 180) / Math.PI : longFov;
	const shortOverH = Math.min(c.width, c.height) / c.height;
	const distance = (2 * tipR) / (fill * 2 * Math.tan((vfovDeg * Math.PI) / 360) * shortOverH);
	const top = lift + thickness;
	const spare = (((1 - fill) / 2) * (2 * tipR)) / fill;
	const offDir = r.between(0, 2 * Math.PI);
	let off = r.next() < 0.6 ? r.between(0.2, 0.8) * spare : 0;
	const occluderRad = r.between(0, 2 * Math.PI);
	const chamfer = r.between(0.5, 1.0);
	const material = c.material;
	let camera: Camera;
	for (;;) {
		camera = makeCamera({
			target: [off * Math.cos(offDir), top, off * Math.sin(offDir)],
			distance,
			tiltDeg,
			azimuthDeg,
			rollDeg,
			vfovDeg,
			width: c.width,
			height: c.height
		});
		const margin = 0.04 * Math.min(c.width, c.height);
		const inside = Array.from({ length: 72 }, (_, i) => (i * Math.PI) / 36).every((a) => {
			const p = project(camera, [tipR * Math.cos(a), top, tipR * Math.sin(a)]);
			return p.x > margin && p.y > margin && p.x < c.width - margin && p.y < c.height - margin;
		});
		if (inside) break;
		off *= 0.6;
		if (off < 1) off = 0;
	}
	const spec: SceneSpec = {
		wheel,
		thickness,
		chamfer,
		boreR,
		keyway,
		holes,
		lift,
		material,
		background: c.background,
		light: c.light,
		occluder: c.occluder,
		occluderRad,
		camera
	};
	return { spec, tiltDeg, rollDeg, od };
}

function truthOf(c: CaseDef, spec: SceneSpec, blockers: Blocker[], r: Rng, od: number, tiltDeg: number, rollDeg: number): Truth {
	const g = spec.wheel;
	const cam = spec.camera;
	const top = spec.lift + spec.thickness;
	const tipAt = (k: number): Vec => {
		const a = positionRad(g, k);
		const rr = g.tipR - spec.chamfer / 2;
		return [rr * Math.cos(a), top - spec.chamfer / 2, rr * Math.sin(a)];
	};
	const centre = project(cam, [0, top, 0]);
	// Which way the wheel's own angle runs in the picture decides the clockwise numbering.
	const a0 = imageAngle(project(cam, tipAt(0)), centre);
	const a1 = imageAngle(project(cam, tipAt(1)), centre);
	const clockwise = (((a1 - a0) % 360) + 360) % 360 > 180;
	const present = g.teeth - g.missing;
	const patternPos = (k: number) => (clockwise ? k : present - 1 - k);
	const gapMid = positionRad(g, g.teeth - (g.missing + 1) / 2);
	const gapPt = project(cam, [g.tipR * Math.cos(gapMid), top, g.tipR * Math.sin(gapMid)]);
	// Tips a person would tap: present, clear of the occluder, spread round the rim.
	const free = Array.from({ length: present }, (_, k) => k).filter((k) => !hidden(cam, tipAt(k), blockers, 3));
	const want = Math.min(free.length, 6 + Math.floor(r.next() * 3));
	const chosen: number[] = [];
	const startFrac = r.next();
	for (let i = 0; i < want; i++) {
		const target = ((startFrac + i / want) % 1) * g.teeth;
		const left = free.filter((k) => !chosen.includes(k));
		left.sort(
			(p, q) =>
				Math.min(Math.abs(p - target), g.teeth - Math.abs(p - target)) - Math.min(Math.abs(q - target), g.teeth - Math.abs(q - target))
		);
		chosen.push(left[0]!);
	}
	chosen.sort((p, q) => patternPos(p) - patternPos(q));
	const tips = chosen.map((k) => project(cam, tipAt(k)));
	const rim = Array.from({ length: 180 }, (_, i) => project(cam, [g.tipR * Math.cos(i / 28.6), top, g.tipR * Math.sin(i / 28.6)]));
	const short = Math.min(c.width, c.height);
	const span =
		c.width <= c.height
			? Math.max(...rim.map((p) => p.x)) - Math.min(...rim.map((p) => p.x))
			: Math.max(...rim.map((p) => p.y)) - Math.min(...rim.map((p) => p.y));
	return {
		file: `${c.name}.jpg`,
		teeth: g.teeth,
		missing: g.missing,
		gaps: [{ first: g.teeth - g.missing, count: g.missing }],
		gapAngleDeg: round(imageAngle(gapPt, centre), 2),
		centre: { x: round(centre.x, 2), y: round(centre.y, 2) },
		tips: tips.map((p) => ({ x: round(p.x, 2), y: round(p.y, 2) })),
		tipPositions: chosen.map(patternPos),
		material: spec.material,
		background: spec.background,
		light: spec.light,
		tiltDeg: round(tiltDeg, 1),
		rollDeg: round(rollDeg, 1),
		occluded: c.occluder !== 'none',
		occluder: c.occluder,
		seed: c.seed,
		width: c.width,
		height: c.height,
		odMm: round(od, 1),
		fill: round(span / short, 3)
	};
}

async function postProcess(png: string, out: string, c: CaseDef, r: Rng) {
	const flash = c.light === 'flash';
	const blur = r.between(0.5, 1.1);
	const { data, info } = await sharp(png).removeAlpha().blur(blur).raw().toBuffer({ resolveWithObject: true });
	const vignette = flash ? r.between(0.35, 0.5) : r.between(0.1, 0.3);
	const noise = r.between(1.5, 3.5);
	const cx = info.width / 2 + r.between(-0.05, 0.05) * info.width;
	const cy = info.height / 2 + r.between(-0.05, 0.05) * info.height;
	const diag = Math.hypot(info.width, info.height) / 2;
	for (let y = 0; y < info.height; y++) {
		for (let x = 0; x < info.width; x++) {
			const d = Math.hypot(x - cx, y - cy) / diag;
			const gain = 1 - vignette * d * d;
			// Mostly luminance noise, as a phone's denoiser leaves it.
			const luma = r.gauss() * noise;
			const i = (y * info.width + x) * 3;
			for (let ch = 0; ch < 3; ch++)
				data[i + ch] = Math.max(0, Math.min(255, Math.round(data[i + ch]! * gain + luma + r.gauss() * noise * 0.3)));
		}
	}
	// mozjpeg and quality 80-86 keep the 40 images under 12 MB in all.
	const quality = Math.round(r.between(80, 86));
	await sharp(data, { raw: { width: info.width, height: info.height, channels: 3 } })
		.jpeg({ quality, mozjpeg: true })
		.toFile(out);
}

async function renderCase(c: CaseDef, outDir: string, work: string, check: boolean, reuse?: string) {
	const r = rng(c.seed);
	const { spec, tiltDeg, rollDeg, od } = buildSpec(c, r);
	const top = spec.lift + spec.thickness;
	if (check) spec.marker = [spec.wheel.tipR * 1.3, top, 0];
	const sceneRng = rng(c.seed ^ 0x5eed);
	const { pov, blockers } = sceneText(spec, sceneRng);
	const povFile = join(work, `${c.name}.pov`);
	let png = join(work, `${c.name}.png`);
	writeFileSync(povFile, pov);
	const t0 = Date.now();
	// A kept render of the very same scene skips POV-Ray (to redo only the post-processing).
	const kept = reuse ? join(reuse, `${c.name}.png`) : '';
	const keptPov = reuse ? join(reuse, `${c.name}.pov`) : '';
	if (kept && existsSync(kept) && existsSync(keptPov) && readFileSync(keptPov, 'utf8') === pov) png = kept;
	else
		execFileSync('povray', [`+I${povFile}`, `+O${png}`, '+FN', `+W${c.width}`, `+H${c.height}`, '-D', '-V', '-GA', '-A', '+Q9'], {
			stdio: ['ignore', 'ignore', 'pipe']
		});
	const truth = truthOf(c, spec, blockers, rng(c.seed ^ 0x7a95), od, tiltDeg, rollDeg);
	if (check) {
		const m = project(spec.camera, spec.marker!);
		console.log(`${c.name}: marker projected at ${m.x.toFixed(1)}, ${m.y.toFixed(1)}; render kept at ${png}`);
		writeFileSync(join(work, `${c.name}.json`), JSON.stringify({ ...truth, marker: m }, null, '\t') + '\n');
		return;
	}
	await postProcess(png, join(outDir, `${c.name}.jpg`), c, rng(c.seed ^ 0x9057));
	writeFileSync(join(outDir, `${c.name}.json`), JSON.stringify(truth, null, '\t') + '\n');
	console.log(
		`${c.name}: ${c.teeth}-${c.missing} ${c.material} on ${c.background}, ${c.light}, ${c.occluder}, ${((Date.now() - t0) / 1000).toFixed(0)} s`
	);
}

async function main() {
	const args = process.argv.slice(2);
	const arg = (name: string) => {
		const i = args.indexOf(name);
		return i >= 0 ? args[i + 1] : undefined;
	};
	const outDir = resolve(arg('--out') ?? DEFAULT_OUT);
	const only = arg('--only')?.split(',');
	const check = args.includes('--check');
	const reuse = arg('--reuse');
	mkdirSync(outDir, { recursive: true });
	const work = check ? join(tmpdir(), 'photo-set-check') : mkdtempSync(join(tmpdir(), 'photo-set-'));
	mkdirSync(work, { recursive: true });
	const all = [...TEST_CASES, ...CALIBRATION_CASES].filter((c) => !only || only.includes(c.name));
	for (const c of all) await renderCase(c, outDir, work, check, reuse);
	if (!check) {
		rmSync(work, { recursive: true, force: true });
		const index = [...TEST_CASES, ...CALIBRATION_CASES].map((c) => ({
			name: c.name,
			set: c.name.startsWith('t') ? 'test' : 'calibration',
			file: `${c.name}.jpg`,
			truth: `${c.name}.json`,
			teeth: c.teeth,
			missing: c.missing
		}));
		writeFileSync(join(outDir, 'index.json'), JSON.stringify({ cases: index }, null, '\t') + '\n');
	}
}

void main();
