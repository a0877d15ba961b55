import { describe, expect, it } from 'vitest';
import { exampleSpec } from '$support/example-spec';
import { exportName } from './names';

describe('export file names', () => {
	it('give the A4 and the Letter template different names, and the DXF and SVG none of a paper', () => {
		const spec = exampleSpec({ odMm: 100 });
		// Names typed here from the pattern (36-1), the diameter and the paper; not read from the code.
		expect(exportName(spec, 'mm', 'pdf', undefined, 'a4')).toBe('wheel-36-1-100mm-a4.pdf');
		expect(exportName(spec, 'mm', 'pdf', undefined, 'letter')).toBe('wheel-36-1-100mm-letter.pdf');
		expect(exportName(spec, 'in', 'pdf', 3, 'letter')).toBe('wheel-36-1-3.937in-letter-r3.pdf');
		expect(exportName(spec, 'mm', 'dxf', 2)).toBe('wheel-36-1-100mm-r2.dxf');
		expect(exportName(spec, 'mm', 'svg')).toBe('wheel-36-1-100mm.svg');
	});
});
