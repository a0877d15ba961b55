// The build sheet: the tuner's and the fabricator's record of one build, on as many pages as it
// takes (one for most): the whole wheel, the engine, the phasing for the wheel's own pattern, the
// TDC record, the tape with its direction of travel and the timing-light card's rows.
import type { ParsedPhasing } from '$lib/schemas/phasing';
import type { Params } from '$lib/schemas/registry';
import type { ParsedWheel } from '$lib/schemas/wheel';
import { wheelParams } from '$lib/schemas/wheel-params';
import { firingTdcs } from '$lib/trade/engine';
import { tdcSideOf, travelWords } from '$lib/trade/hub';
import { gapsOf } from '$lib/trade/pattern';
import { clockingFor, type PhasingResult } from '$lib/trade/phasing';
import type { WheelSummary } from '$lib/trade/summary';
import { fromTdcLine, markName, mmPerDegree, outsideNote, windowWords, type TapeMark, type TapeSpec } from '$lib/trade/tape';
import { sideText, type TdcResult } from '$lib/trade/tdc';
import { formatLength } from '$lib/trade/units';
import { finish, missingNote, mm, newDocument, papers, printable } from './pdf-kit';
import { specRows } from './wheel-pdf';

/** The tape on the sheet: its spec (each cylinder's TDC from the engine), the saved tape's label, its marks. */
export interface SheetTape {
	spec: TapeSpec;
	label: string | null;
	/** A degree tape saved to the build (else the hub diameter alone was given). */
	saved: boolean;
	marks: TapeMark[];
}

/** The timing-light card's rows as the sheet prints them. */
export interface SheetCard {
	from: string;
	rows: { what: string; advanceDeg: number; fromTdcMm: number; side: 'left' | 'right' | null }[];
}

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
	/** The wheel's parameters as given or saved: listed whole, so no part of the design goes unsaid. */
	given: Params;
	tape: SheetTape | null;
	card: SheetCard | null;
	/** The newest signal check saved in the build: each speed case's sync margin then (absent from the public tool). */
	signal?: SheetSignal | null;
}

/** A saved signal check as the sheet prints it. */
export interface SheetSignal {
	label: string;
	date: string;
	cases: { name: string; rpm: number; marginPct: number; verdict: 'safe' | 'tight' | 'fails' }[];
}

const margin = 15;
const caution =
	"Verify timing with a timing light before putting the engine under load; wrong timing can kick back. Follow the ECU maker's instructions, local codes and licensed professionals.";

export async function buildSheetPdf(s: BuildSheet): Promise<Buffer> {
	const size = papers[s.wheel.paper];
	const doc = newDocument(`Build sheet: ${s.buildName}`, size);
	const width = mm(size.widthMm - 2 * margin);
	const valueWidth = mm(size.widthMm - 2 * margin - 54);
	/** Where text stops: the caution sits below, on every page. */
	const bottom = size.heightMm - margin - 12;
	const foot = () =>
		doc
			.font('text')
			.fontSize(7.5)
			.fillColor('black')
			.text(caution, mm(margin), mm(size.heightMm - margin - 8), { width });
	foot();
	let y = margin;
	const room = (needMm: number) => {
		if (y + needMm <= bottom) return;
		doc.addPage({ size: [mm(size.widthMm), mm(size.heightMm)], margin: 0 });
		foot();
		y = margin;
	};
	const section = (title: string) => {
		room(13);
		y += 2.5;
		doc.font('bold').fontSize(10).fillColor('black').text(title, mm(margin), mm(y));
		y += 5;
	};
	const row = (k: string, v: string) => {
		const h = Math.max(4, doc.font('mono').fontSize(8).heightOfString(v, { width: valueWidth }) / mm(1) + 0.8);
		room(h);
		doc
			.font('text')
			.fontSize(8)
			.fillColor('black')
			.text(k, mm(margin), mm(y), { width: mm(52) });
		doc
			.font('mono')
			.fontSize(8)
			.text(v, mm(margin + 54), mm(y), { width: valueWidth });
		y += h;
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
	const L = (v: number) => formatLength(v, s.wheel.units);
	section('Wheel');
	for (const [k, v] of specRows(spec, s.summary, s.wheel.units)) row(k, v);
	// What the shared rows leave out: the shaft a standard key was looked up by, the balance holes' spacing.
	const shaft = s.given.shaft;
	if (spec.keyway && shaft)
		row('Shaft (key looked up by)', /^[\d.\s/]+$/.test(shaft) ? `${shaft} ${s.wheel.units}` : printable(shaft).text);
	if (spec.balanceHoles?.spacingDeg !== undefined) row('Balance hole spacing', `${spec.balanceHoles.spacingDeg}° between neighbours`);
	row(
		'Residual unbalance',
		s.summary.unbalance.gmm <= s.summary.permissible.gmm
			? `within ISO 21940-11 G ${s.summary.permissible.grade}: ${s.summary.unbalance.gmm.toFixed(2)} of ${s.summary.permissible.gmm.toFixed(2)} g·mm allowed`
			: `over ISO 21940-11 G ${s.summary.permissible.grade}: ${s.summary.unbalance.gmm.toFixed(2)} g·mm, ${s.summary.permissible.gmm.toFixed(2)} allowed`
	);
	const given = wheelParams.names.filter((n) => s.given[n] !== undefined).map((n) => `${n}=${s.given[n]}`);
	row('Parameters as given', printable(given.join(', '), 'mono').text || 'the defaults');

	section('Engine');
	const tdcs = firingTdcs(p.intervals);
	row('Engine', `${s.phasing.layoutLabel}; firing intervals ${p.intervals.join(' / ')}°`);
	row('Stroke', `${p.stroke}-stroke (${p.stroke === 4 ? 720 : 360} crank degrees a cycle)`);
	row('Cylinder TDCs', tdcs.map((t, i) => `cyl ${i + 1} at ${t}°`).join(', ') + " after cylinder 1's TDC, crank degrees");
	row('Rev limit, cranking', `${p.revLimitRpm} rpm, ${p.crankingRpm} rpm`);

	section('Sensor and phasing');
	// The phasing page's words (src/lib/schemas/phasing.ts labels), so the sheet reads like the check.
	row(
		'Shaft the wheel turns with',
		p.mount === 'crank' ? 'the crankshaft' : 'the camshaft (half speed: one wheel degree is two crank degrees)'
	);
	row(
		'Sensor, tooth edge timed',
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
	row('First-tooth offset', `${r.firstToothOffsetDeg}° BTDC: the angle to enter in your ECU (its set-up may call it something else)`);
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
	const tape = s.tape;
	if (!tape) row('Degree tape', 'not recorded');
	else {
		const t = tape.spec;
		const perDeg = mmPerDegree(t);
		row(
			'Degree tape',
			`${tape.label ? `“${printable(tape.label).text}”: ` : ''}hub ${L(t.hubDiameterMm)}, ${formatLength(perDeg, s.wheel.units)} per degree, ${windowWords(t)} window${tape.saved ? '' : ' (from the hub diameter given; the crank turning as the wheel says)'}`
		);
		row('Direction of travel', travelWords(t.rotation));
		const where = (atdc: number) => {
			const at = fromTdcLine(t, atdc);
			return at.side ? `${L(at.fromTdcMm)} ${at.side} of TDC` : 'on the TDC line';
		};
		const marks = tape.marks.filter((m) => m.kind === 'tdc' || m.cylinder === 1);
		if (marks.length)
			row(
				'Marks on the tape',
				marks
					.map((m) =>
						m.onTape ? `${printable(markName(m)).text} (${sideText(m.atdcDeg)}): ${where(m.atdcDeg)}` : printable(outsideNote(t, m)).text
					)
					.join('; ')
			);
	}

	section('Timing-light card');
	const card = s.card;
	if (!card) row('Rows', tape ? 'no advance curve or spec timings saved with the tape' : 'no degree tape recorded');
	else {
		row('From', card.from);
		for (const r of card.rows)
			row(
				printable(r.what).text,
				`${r.advanceDeg === 0 ? 'TDC' : `${Math.abs(r.advanceDeg)}° ${tdcSideOf(-r.advanceDeg)}`}: ${r.side ? `${L(r.fromTdcMm)} ${r.side} of TDC` : 'on the TDC line'}`
			);
	}

	if (s.signal !== undefined) signalRows(s.signal, row, section);

	section('Warnings outstanding');
	const warnings = [...s.summary.warnings.map((w) => w.message), ...r.warnings.map((w) => w.message)];
	if (!warnings.length) row('', 'none');
	for (const w of warnings) {
		const h = doc.font('text').fontSize(7.5).heightOfString(`• ${w}`, { width });
		room(h / mm(1) + 1.2);
		doc.fillColor('#8a5200').text(`• ${w}`, mm(margin), mm(y), { width });
		y += h / mm(1) + 1.2;
	}
	doc.fillColor('black');
	return finish(doc);
}

/** The sync margin of each speed case of the newest saved signal check: will the ECU find the gap. */
function signalRows(signal: SheetSignal | null, row: (k: string, v: string) => void, section: (title: string) => void) {
	section('Signal check');
	if (!signal) {
		row('Sync margin', 'no signal check saved in the build');
		return;
	}
	row('Saved', `${signal.label ? `“${printable(signal.label).text}”, ` : ''}${signal.date}`);
	for (const c of signal.cases) row(printable(`${c.name}, ${c.rpm} rpm`).text, `sync margin ${Math.round(c.marginPct)}%: ${c.verdict}`);
}
