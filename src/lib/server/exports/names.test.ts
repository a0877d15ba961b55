import { describe, expect, it } from 'vitest';
import { exampleSpec } from '$support/example-spec';
import { buildSheetName, exportName } from './names';

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

	it('name a build sheet by its build and revision, with a name for a build without letters or digits', () => {
		// Typed here from the names: lower case, hyphens for spaces and punctuation (common practice for file names).
		expect(buildSheetName('Trail single 500')).toBe('build-sheet-trail-single-500.pdf');
		expect(buildSheetName('Sheet bench 650', 2)).toBe('build-sheet-sheet-bench-650-r2.pdf');
		expect(buildSheetName('  “Zündung” V-52!  ')).toBe('build-sheet-z-ndung-v-52.pdf');
		expect(buildSheetName('…')).toBe('build-sheet-build.pdf');
	});
});
