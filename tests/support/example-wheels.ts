// Example wheels as the designer and the API take them (flat strings), shared by the tests that
// read the same wheel back through different files (JSON, DXF).

/** 60-2 in inches with an ANSI B17.1 keyway for a 1 in shaft, filleted tips and roots. */
export const wheel60x2InchB17 = {
	teeth: '60',
	missing: '2',
	od: '6',
	depth: '3/16',
	duty: '0.45',
	bore: '1',
	keyway: 'b17.1',
	shaft: '1',
	tipRadius: '0.02',
	rootRadius: '0.02',
	thickness: '1/8',
	units: 'in'
};

/** 36-1-1: two single gaps 180° apart, with a four-hole bolt circle. */
export const wheel36x1x1Bolts = {
	pattern: 'custom',
	teeth: '36',
	gaps: '17,35',
	od: '120',
	depth: '6',
	bore: '25',
	bolts: '4',
	pcd: '60',
	boltHole: '6.5',
	units: 'mm'
};

/**
 * 36-1, 100 mm, 5 mm teeth, on a 20 mm shaft with a DIN 6885-1 key at 90 wheel degrees, turning
 * clockwise, four bolt holes and two balance holes: the shop drawing's wheel.
 */
export const wheel36x1Keyed = {
	units: 'mm',
	teeth: '36',
	missing: '1',
	od: '100',
	depth: '5',
	thickness: '3',
	material: 'steel',
	bore: '20',
	keyway: 'din6885',
	shaft: '20',
	keywayAngle: '90',
	rotation: 'cw',
	bolts: '4',
	pcd: '60',
	boltHole: '6.5',
	boltAngle: '45',
	balanceCount: '2',
	balancePcd: '76',
	balanceHole: '5',
	balanceAngle: '200'
};
