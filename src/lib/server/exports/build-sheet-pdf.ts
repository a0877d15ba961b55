// The build sheet: one page the tuner and the fabricator can work from.
import type { ParsedPhasing } from '$lib/schemas/phasing';
import type { ParsedWheel } from '$lib/schemas/wheel';
import { firingTdcs } from '$lib/trade/engine';
import { gapsOf } from '$lib/trade/pattern';
import { clockingFor, type PhasingResult } from '$lib/trade/phasing';
import type { WheelSummary } from '$lib/trade/summary';
import { mmPerDegree } from '$lib/trade/tape';
import { sideText, type TdcResult } from '$lib/trade/tdc';
import { formatLength } from '$lib/trade/units';
import { finish, missingNote, mm, newDocument, papers, printable } from './pdf-kit';
import { specRows } from './wheel-pdf';

export interface BuildSheet {
	buildName: string;
	revision: string;
	date: string;
	wheel: ParsedWheel;
	summary: WheelSummary;
	phasing: ParsedPhasing;
	result: PhasingResult;
	tdc: { a: number; b: number; result: TdcResult } | null;
	tapeHubMm: number | null;
}

const margin = 15;

export async function buildSheetPdf(s: BuildSheet): Promise<Buffer> {
	const size = papers[s.wheel.paper];
	const doc = newDocument(`Build sheet: ${s.buildName}`, size);
	const width = mm(size.widthMm - 2 * margin);
	let y = margin;
	const section = (title: string) => {
		y += 3;
		doc.font('bold').fontSize(10).fillColor('black').text(title, mm(margin), mm(y));
		y += 5.5;
	};
	const row = (k: string, v: string) => {
		doc
			.font('text')
			.fontSize(8)
			.fillColor('black')
			.text(k, mm(margin), mm(y), { width: mm(52) });
		const h = doc
			.font('mono')
			.fontSize(8)
			.heightOfString(v, { width: mm(size.widthMm - 2 * margin - 54) });
		doc.text(v, mm(margin + 54), mm(y), { width: mm(size.widthMm - 2 * margin - 54) });
		y += Math.max(4.4, h / mm(1) + 1);
	};

	const name = printable(s.buildName, 'bold');
	const revision = printable(s.revision);
	const missing = [...new Set([...name.missing, ...revision.missing])];
	doc.font('bold').fontSize(15).text(`Build sheet: ${name.text}`, mm(margin), mm(y));
	y += 8;
	doc
		.font('text')
		.fontSize(8.5)
		.text(`Wheel revision ${revision.text} · ${s.date} · for the tuner and the fabricator`, mm(margin), mm(y), { width });
	y += 5;
	if (missing.length) {
		doc.font('text').fontSize(8).fillColor('#8a5200').text(missingNote(missing), mm(margin), mm(y), { width });
		doc.fillColor('black');
		y += 4.5;
	}

	const { spec } = s.wheel;
	const p = s.phasing.input;
	const r = s.result;
	section('Wheel');
	for (const [k, v] of specRows(spec, s.summary, s.wheel.units)) row(k, v);

	section('Sensor and phasing');
	row('Wheel on', p.mount === 'crank' ? 'the crank' : 'the cam (half speed: one wheel degree is two crank degrees)');
	row(
		'Sensor, edge read',
		`${s.phasing.sensor === 'hall' ? 'Hall-effect' : 'variable reluctance (VR)'}, ${p.edge} tooth edge, up to ${p.sensorMaxHz} Hz`
	);
	const m = s.phasing.measured;
	if (m) {
		const unit = p.mount === 'cam' ? 'crank degrees (twice the angle round the cam)' : 'crank degrees';
		row(
			'Measured with cylinder 1 at TDC',
			`sensor ${m.sensorFromTdcDeg}° before the TDC mark, key ${m.keyFromTdcDeg}° before it (${unit}); keyway at ${m.keywayDeg}° of wheel from tooth 0's leading edge`
		);
	}
	row(
		'Tooth at the sensor at TDC',
		`${Number(p.toothAtTdc.toFixed(3))} (tooth 0 = first after the gap${m ? ', worked out from the angles' : ''})`
	);
	row('First-tooth offset', `${r.firstToothOffsetDeg}° BTDC`);
	const clock = s.phasing.clocking;
	if (clock)
		row(
			'Clocking for a target',
			`keyway angle ${clockingFor(clock.targetDeg, clock.keyFromSensorDeg, p.mount)}° of wheel gives ${clock.targetDeg}° BTDC`
		);
	row('Pitch, resolution', `${r.pitchDeg}° of wheel, ${r.resolutionDeg} crank degrees per tooth`);
	row('Tooth pitch frequency', `${r.pitchFrequencyHz} Hz at ${p.revLimitRpm} rpm`);
	// The wheel's own pattern, gap by gap, as the phasing check saw it (every gap, every pass).
	const gaps = gapsOf(p.pattern);
	const where = gaps.map((g) => (g.count === 1 ? `position ${g.first}` : `positions ${g.first}–${g.first + g.count - 1}`)).join(', ');
	const gapWords = gaps.length === 1 ? 'the gap' : `the ${gaps.length} gaps`;
	row('Gaps in the pattern', gaps.length ? `${gaps.length}: missing ${where}` : 'none');
	row(
		'Gap at cranking',
		r.gapAtCrankingMs === null
			? `no gap on this wheel (${p.pattern.kind === 'extra' ? 'it keeps its cam sync by the extra tooth' : 'the ECU needs another sync signal'})`
			: `${r.gapAtCrankingMs} ms at ${p.crankingRpm} rpm${gaps.length > 1 ? ' (the shortest gap)' : ''}`
	);
	row('Engine', `${s.phasing.layoutLabel}; firing intervals ${p.intervals.join(' / ')}°`);
	const tdcs = firingTdcs(p.intervals);
	row(
		'Gap clearance',
		gaps.length
			? r.gapClearanceDeg
					.map((c) => `cyl ${c.cylinder} (TDC at ${tdcs[c.cylinder - 1]}°): ${c.clearanceDeg}°${c.clearanceDeg === 0 ? ' (inside)' : ''}`)
					.join('; ') + ` from the ${p.windowFromBtdc}°–${p.windowToBtdc}° BTDC spark window, nearest of ${gapWords}`
			: 'no gap on this wheel, nothing to keep clear of the spark window'
	);

	section('TDC record and tape');
	row(
		'Piston-stop marks',
		s.tdc
			? `${sideText(s.tdc.a)} and ${sideText(s.tdc.b)}: true TDC ${sideText(s.tdc.result.tdcDeg)} of the scale's 0, spread ${s.tdc.result.spreadDeg}° (${s.tdc.result.halfSpreadDeg}° each side)`
			: 'not recorded'
	);
	row(
		'Degree tape',
		s.tapeHubMm
			? `hub ${formatLength(s.tapeHubMm, s.wheel.units)}, ${formatLength(mmPerDegree({ hubDiameterMm: s.tapeHubMm, paperThicknessMm: 0.1 }), s.wheel.units)} per degree`
			: 'not recorded'
	);

	section('Warnings outstanding');
	const warnings = [...s.summary.warnings.map((w) => w.message), ...r.warnings.map((w) => w.message)];
	if (!warnings.length) row('', 'none');
	for (const w of warnings) {
		const h = doc.font('text').fontSize(7.5).heightOfString(`• ${w}`, { width });
		doc.fillColor('#8a5200').text(`• ${w}`, mm(margin), mm(y), { width });
		y += h / mm(1) + 1.2;
	}
	doc
		.font('text')
		.fontSize(7.5)
		.fillColor('black')
		.text(
			"Verify timing with a timing light before putting the engine under load; wrong timing can kick back. Follow the ECU maker's instructions, local codes and licensed professionals.",
			mm(margin),
			mm(size.heightMm - margin - 8),
			{ width }
		);
	return finish(doc);
}
