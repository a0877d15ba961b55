/**
 * The product's tools, in one list. The navigation and the home page both read it.
 * A tool is shown as "in the works", without a link, until its page exists;
 * setting `ready: true` here is the only change needed to link it everywhere.
 */
export interface Tool {
	/** Stable key, also used for test ids. */
	id: 'wheel' | 'tape' | 'tdc' | 'phasing' | 'signal' | 'builds';
	href: `/${string}`;
	title: string;
	/** One sentence, in the trade's words. */
	summary: string;
	ready: boolean;
}

export const tools: readonly Tool[] = [
	{
		id: 'wheel',
		href: '/wheel',
		title: 'Wheel designer',
		summary:
			'Lay out a missing-tooth trigger wheel (N-M pattern, tooth depth, bore, keyway, bolt circle) and export DXF, SVG or a 1:1 PDF template for the cutter.',
		ready: true
	},
	{
		id: 'tape',
		href: '/tape',
		title: 'Degree tape',
		summary: 'Print a degree tape sized to your timing hub, zero at TDC, with BTDC on the correct side for the crank rotation.',
		ready: true
	},
	{
		id: 'tdc',
		href: '/tdc',
		title: 'TDC finder',
		summary: 'Enter the two piston-stop marks and get true TDC half-way between them, in crank degrees.',
		ready: true
	},
	{
		id: 'phasing',
		href: '/phasing',
		title: 'Phasing check',
		summary:
			'Place the sensor, get the first-tooth offset for the ECU, and check gap clearance and tooth pitch frequency at the rev limit.',
		ready: true
	},
	{
		id: 'signal',
		href: '/signal',
		title: 'Signal check',
		summary:
			'Simulate the sensor over the engine’s speed swings, cranking to the rev limit: will the ECU find the gap, and where is it best placed?',
		ready: true
	},
	{
		id: 'builds',
		href: '/builds',
		title: 'Builds',
		summary: 'Keep each engine’s wheel designs, TDC records and build sheets together, versioned, in your workshop.',
		ready: true
	}
];

/** True when `pathname` is the tool's page or one below it. */
export function isCurrent(tool: Tool, pathname: string): boolean {
	return pathname === tool.href || pathname.startsWith(`${tool.href}/`);
}
