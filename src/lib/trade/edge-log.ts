import { refusal, type Checked } from '../schemas/refusal';
import type { Pattern } from './pattern';

// The edge log: tooth edges recorded from a running engine (an ECU's tooth logger, a scope), one
// value per row, read back into the wheel's pattern (docs/edge-log-format.md says what a file may
// hold). This file reads the text; edge-log-read.ts finds the pattern, the noise, the speed swing
// and the runout in it. Pure: the page and POST /api/v1/signal/log call the same functions.

import { listedAtMost } from './edge-log-read';

export { readEdgeLog } from './edge-log-read';

/** What a row holds: the time of an edge, or the time between two edges (a tooth space). */
export type EdgeLogKind = 'times' | 'spaces';
export type EdgeLogUnit = 's' | 'ms' | 'us';

export interface EdgeLog {
	kind: EdgeLogKind;
	unit: EdgeLogUnit;
	/** Whether the header row named the unit, or it was inferred from the numbers (the notes say how). */
	from: 'header' | 'inferred';
	/** Every space between two successive edges, in microseconds, in log order. */
	spacesUs: number[];
	/**
	 * The file row (1-based, as an editor counts lines) where each space ends: the row of the edge
	 * closing it in a times log, the space's own row in a spaces log.
	 */
	rows: number[];
	/** Edges in the log: rows for a times log, spaces + 1 for a spaces log (the first space starts at an unlogged edge). */
	edges: number;
	/** How the kind or unit was decided, when it was not given (shown beside the reading). */
	notes: string[];
}

/** The wheel the log is compared with: N-M, or a pattern from pattern.ts. */
export type EdgeLogDesign = { teeth: number; missing: number } | Pattern;

export interface EdgeLogPattern {
	/** N: tooth positions round the wheel, the missing ones counted. */
	teeth: number;
	/** M: positions missing in a row, making the gap. */
	missing: number;
	/** Edge index (0-based, the log's first edge is 0) of the first edge after the first gap in the log: tooth 0. */
	gapAt: number;
	/** The file row of that edge (a times log), or of the gap's own space (a spaces log). */
	gapRow: number;
}

export interface EdgeLogReading {
	kind: EdgeLogKind;
	unit: EdgeLogUnit;
	from: 'header' | 'inferred';
	edges: number;
	/** Found from the spaces alone; null when no space stands out as a gap at a steady interval. */
	pattern: EdgeLogPattern | null;
	/** Null without a design to compare with. */
	matchesDesign: boolean | null;
	/** The comparison in words (`the log shows 60-2; the design is 36-1`), null without a design. */
	designDifference: string | null;
	/** Edges the sensor should have given and did not: rows of the spaces that swallowed them (at most `listed`). */
	missingEdges: { count: number; at: { row: number; count: number }[] };
	/** Edges where no tooth is (a doubled edge, a spike, an edge inside the gap), by row (at most `listed`). */
	extraEdges: { count: number; rows: number[] };
	/**
	 * Per whole turn of the wheel: (fastest − slowest) over the turn's mean speed, in percent, the
	 * speed taken over each tooth space. Runout and jitter add to it.
	 */
	speedSwingPct: { perTurn: number[]; mean: number; max: number } | null;
	/**
	 * The once-per-turn wobble of the spaces (an eccentric wheel or a loose sensor): a sine fitted to
	 * each tooth's speed over the speed expected there (space over expected length, inverted: the
	 * same to first order, without a swing's square), over whole turns, an even number where the log
	 * has them. `amplitudePct` is the sine's amplitude in percent of a space; `phaseDeg` the wheel
	 * angle, from tooth 0's edge in the sense of rotation, where the spaces are longest.
	 */
	runout: { amplitudePct: number; phaseDeg: number } | null;
	/** Whole turns between the first and the last tooth-0 edge (what the swing and runout are read over). */
	turns: number;
	/** Turns the whole log covers over its length in time, per minute; null without a pattern. */
	meanRpm: number | null;
	notes: string[];
}

/**
 * A log's limits: 4 MiB of text and 200,000 rows (a 60-2 at 6000 rpm for 35 s; 100,000 edges in
 * microseconds come to about 1 MB). The API refuses a larger body with 413 before reading it.
 */
export const edgeLogLimits = { bytes: 4 * 1024 * 1024, rows: 200_000, listed: listedAtMost } as const;

const numberCell = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const toUs: Record<EdgeLogUnit, number> = { s: 1e6, ms: 1e3, us: 1 };
const unitWords: Record<string, EdgeLogUnit> = {
	s: 's',
	sec: 's',
	secs: 's',
	second: 's',
	seconds: 's',
	ms: 'ms',
	msec: 'ms',
	millisecond: 'ms',
	milliseconds: 'ms',
	us: 'us',
	µs: 'us',
	μs: 'us',
	usec: 'us',
	microsecond: 'us',
	microseconds: 'us'
};
const spaceWords = new Set(['space', 'spaces', 'gap', 'interval', 'intervals', 'period', 'delta', 'dt']);

/** The unit and kind a header's first column names, as far as it names them. */
function headerWords(cell: string): { unit?: EdgeLogUnit; kind?: EdgeLogKind } {
	const words = cell.toLowerCase().split(/[^a-zµμ]+/u);
	const unit = words.map((w) => unitWords[w]).find((u) => u !== undefined);
	const kind = words.some((w) => spaceWords.has(w)) ? 'spaces' : words.some((w) => w === 'time' || w === 't') ? 'times' : undefined;
	return { unit, kind };
}

const median = (values: number[]) => {
	const sorted = Float64Array.from(values).sort();
	return sorted.length ? sorted[sorted.length >> 1]! : NaN;
};

/**
 * The unit of a log without one in its header, from its typical space: no tooth space of a
 * running engine is under 2 µs (120 teeth at 20,000 rpm: 25 µs) or over 2 s (one tooth at 30
 * rpm), so a median under 2 is seconds and one of 20 or more microseconds. Between the two, and
 * for milliseconds always, the header has to say.
 */
function inferredUnit(typical: number): EdgeLogUnit | null {
	if (typical > 0 && typical < 2) return 's';
	if (typical >= 20) return 'us';
	return null;
}

const fmt = (x: number) => (Math.abs(x) >= 1000 || Number.isInteger(x) ? String(Math.round(x)) : x.toPrecision(3));

/** A log's text read into tooth spaces, or the first thing wrong with it (on the field `log`, naming the row). */
export function parseEdgeLog(text: string): Checked<EdgeLog> {
	const no = (message: string): Checked<EdgeLog> => ({ ok: false, refusals: [refusal('log', message)] });
	if (text.length > edgeLogLimits.bytes) return no(`at most ${edgeLogLimits.bytes / 1024 / 1024} MiB of text; split the log`);

	const values: number[] = [];
	const rows: number[] = [];
	let header: { unit?: EdgeLogUnit; kind?: EdgeLogKind; row: number } | null = null;
	// A byte order mark, which spreadsheet programs write first, is no part of the header.
	let body = text.replace(/^\uFEFF/, '');
	// Lines end in \n or \r\n; a file from an old Mac in \r alone.
	if (!body.includes('\n')) body = body.replace(/\r/g, '\n');
	// Scanned rather than split: a 200,000-row log would otherwise be as many arrays again.
	for (let start = 0, row = 1; start < body.length; row++) {
		const lineEnd = body.indexOf('\n', start);
		const line = body.slice(start, lineEnd < 0 ? body.length : lineEnd).trim();
		start = lineEnd < 0 ? body.length : lineEnd + 1;
		if (line === '' || line.startsWith('#')) continue;
		// The first column only: a second (a tooth number, a level, a channel) is the logger's, not ours.
		const cut = line.search(/[\s,;]/);
		const cell = cut < 0 ? line : line.slice(0, cut);
		if (!numberCell.test(cell)) {
			if (values.length === 0 && header === null) {
				header = { ...headerWords(line.split(/\s*[,;\t]\s*/)[0]!), row };
				continue;
			}
			return no(`row ${row}: not a number (“${cell.slice(0, 20)}”); one edge time or tooth space per row, a point for decimals`);
		}
		if (values.length >= edgeLogLimits.rows)
			return no(`row ${row}: more than ${edgeLogLimits.rows.toLocaleString('en')} rows; split the log`);
		const value = Number(cell);
		if (!Number.isFinite(value) || Math.abs(value) > 1e15) return no(`row ${row}: too large a number (“${cell.slice(0, 20)}”)`);
		values.push(value);
		rows.push(row);
	}

	const notes: string[] = [];
	if (values.length < 3)
		return no(
			`${values.length ? `only ${values.length} row${values.length > 1 ? 's' : ''}` : 'no rows'}: one edge time or tooth space per row, at least three`
		);

	let kind = header?.kind;
	if (!kind) {
		// Edge times climb all the way; spaces go up at each gap and down after it. The climb over the
		// way travelled tells them apart without any scale.
		let travelled = 0;
		for (let i = 1; i < values.length; i++) travelled += Math.abs(values[i]! - values[i - 1]!);
		const climb = travelled > 0 ? (values[values.length - 1]! - values[0]!) / travelled : 0;
		if (climb > 0.9) kind = 'times';
		else if (climb < 0.5) kind = 'spaces';
		else return no('cannot tell edge times from tooth spaces; head the first column with time_us, time_s or space_us');
		notes.push(
			`Read as ${kind === 'times' ? 'edge times' : 'tooth spaces'}: the values ${kind === 'times' ? 'climb row by row' : 'rise and fall'} (no header said which).`
		);
	}

	const spaces: number[] = [];
	const spaceRows: number[] = [];
	if (kind === 'times') {
		for (let i = 1; i < values.length; i++) {
			const space = values[i]! - values[i - 1]!;
			if (space < 0) return no(`row ${rows[i]}: time goes backwards (${fmt(values[i]!)} after ${fmt(values[i - 1]!)})`);
			spaces.push(space);
			spaceRows.push(rows[i]!);
		}
	} else {
		for (let i = 0; i < values.length; i++) {
			if (values[i]! < 0) return no(`row ${rows[i]}: a tooth space cannot be negative (${fmt(values[i]!)})`);
			spaces.push(values[i]!);
			spaceRows.push(rows[i]!);
		}
	}
	const typical = median(spaces.filter((s) => s > 0));
	if (!(typical > 0)) return no('every space is zero: the edges carry no time');

	let unit = header?.unit;
	if (!unit) {
		// A spaces log headed only `space` is in microseconds, what tooth loggers write.
		unit = header?.kind === 'spaces' ? 'us' : (inferredUnit(typical) ?? undefined);
		if (!unit)
			return no(
				`cannot tell the unit: a typical space of ${fmt(typical)} could be milliseconds; head the first column with its unit (s, ms or us)`
			);
		notes.push(
			header?.kind === 'spaces'
				? 'Spaces read in microseconds (the header said space without a unit).'
				: `Read in ${unit === 's' ? 'seconds' : 'microseconds'}: a typical space of ${fmt(typical)} (no header said the unit; milliseconds need one).`
		);
	}
	const scale = toUs[unit];
	return {
		ok: true,
		value: {
			kind,
			unit,
			from: header?.unit ? 'header' : 'inferred',
			spacesUs: spaces.map((s) => s * scale),
			rows: spaceRows,
			edges: kind === 'times' ? values.length : values.length + 1,
			notes
		}
	};
}
