import type { ParamDef } from './registry';

// Public parameters more than one tool takes (the wheel, the phasing check, the tape, the photo
// reading): one definition, so a name has one label, one help text and one meaning everywhere.
// A tool may narrow a range (`{ ...common.teeth, min: 2 }`) but keeps the label.

export const common = {
	units: {
		name: 'units',
		label: 'Units',
		help: 'Lengths in millimetres or inches; inch lengths may be fractions like 3 1/2.',
		kind: 'choice',
		values: ['mm', 'in'],
		default: 'mm'
	},
	pattern: {
		name: 'pattern',
		label: 'Pattern',
		help: 'missing: N teeth with M in a row left out; custom: any positions left out; single: one tooth (cam); extra: N evenly spaced plus one.',
		kind: 'choice',
		values: ['missing', 'custom', 'single', 'extra'],
		default: 'missing'
	},
	teeth: {
		name: 'teeth',
		label: 'Teeth',
		help: 'Tooth positions round the wheel, counting the missing ones (the N of N-M).',
		kind: 'whole',
		min: 1,
		max: 720,
		required: true
	},
	missing: {
		name: 'missing',
		label: 'Missing',
		help: 'Positions left out in a row to make the gap (the M of N-M).',
		kind: 'whole',
		min: 0,
		max: 719,
		appliesWhen: (p) => !p.pattern || p.pattern === 'missing'
	},
	gaps: {
		name: 'gaps',
		label: 'Gap positions',
		help: 'The positions left out, counted from position 0, separated by commas (17, 35).',
		kind: 'free',
		allows: 'whole position numbers separated by commas, like 17, 35',
		appliesWhen: (p) => p.pattern === 'custom'
	},
	extraAfter: {
		name: 'extraAfter',
		label: 'Extra tooth after position',
		kind: 'whole',
		min: 0,
		max: 719,
		default: '0',
		appliesWhen: (p) => p.pattern === 'extra'
	},
	duty: {
		name: 'duty',
		label: 'Tooth width',
		help: 'The tooth’s share of the pitch, 0.05 to 0.95 (0.5: tooth and space alike).',
		kind: 'number',
		min: 0.05,
		max: 0.95
	},
	od: { name: 'od', label: 'Outside diameter', help: 'Across the tooth tips.', kind: 'length', minMm: 10, maxMm: 2000 },
	rotation: {
		name: 'rotation',
		label: 'Rotation',
		help: 'Which way the crank turns, seen from the side the wheel is on.',
		kind: 'choice',
		values: ['cw', 'ccw'],
		labels: { cw: 'Clockwise', ccw: 'Counter-clockwise' },
		default: 'cw'
	},
	keywayAngle: {
		name: 'keywayAngle',
		label: 'Keyway angle',
		help: 'Where the keyway sits, in degrees from the gap’s reference.',
		kind: 'angle',
		min: -360,
		max: 360,
		default: '0'
	},
	rpm: {
		name: 'rpm',
		label: 'Rev limit',
		help: 'The highest crank speed the wheel will turn at, rpm.',
		kind: 'whole',
		min: 100,
		max: 30000,
		default: '8000'
	},
	paper: { name: 'paper', label: 'Paper', kind: 'choice', values: ['a4', 'letter'], labels: { a4: 'A4', letter: 'Letter' }, default: 'a4' },
	diameter: {
		name: 'diameter',
		label: 'Hub diameter',
		help: 'The timing hub’s rim, where the degree tape or scale sits. Decimals or fractions.',
		kind: 'length',
		minMm: 10,
		maxMm: 2000
	},
	// The wheel's size and stock, which the build sheet asks for too (ranges as src/lib/schemas/wheel.ts reads them).
	depth: { name: 'depth', label: 'Tooth depth', help: 'From the tooth tip to the root.', kind: 'length', minMm: 0.2, maxMm: 200 },
	thickness: { name: 'thickness', label: 'Thickness', help: 'Of the plate the wheel is cut from.', kind: 'length', minMm: 0.2, maxMm: 50 },
	bore: { name: 'bore', label: 'Bore', help: 'The centre hole; 0 for none.', kind: 'length', minMm: 0, maxMm: 1900 },
	material: {
		name: 'material',
		label: 'Material',
		help: 'For the mass and the balance; custom takes a density.',
		kind: 'choice',
		values: ['steel', 'stainless', 'aluminium', 'custom'],
		default: 'steel'
	}
} as const satisfies Record<string, ParamDef>;
