import { describe, expect, it } from 'vitest';
import { singleLine } from './text';

// The characters refused are typed from the Unicode Character Database (general category Cc:
// U+0000–001F, U+007F–009F; Zl U+2028, Zp U+2029; the explicit directional formatting characters
// of UAX #9, section 2.1–2.2: U+202A–202E, U+2066–2069).
const name = singleLine('name', 20, 1);

describe('singleLine', () => {
	it('refuses every control, separator and direction-override character, naming the field and the character', () => {
		const refused = [0x00, 0x09, 0x0a, 0x0d, 0x1b, 0x7f, 0x85, 0x9f, 0x2028, 0x2029, 0x202a, 0x202e, 0x2066, 0x2069];
		for (const cp of refused) {
			const result = name.safeParse(`ab${String.fromCodePoint(cp)}cd`);
			expect(result.success, cp.toString(16)).toBe(false);
			expect(result.error!.issues[0]!.message).toMatch(
				new RegExp(`^name: one line .*U\\+${cp.toString(16).toUpperCase().padStart(4, '0')}`)
			);
		}
		expect(name.safeParse('ab\ud800cd').success).toBe(false);
	});

	it('keeps letters of any script, emoji and ordinary punctuation; trims; caps the length', () => {
		for (const ok of ['Zündkurve', 'Жигули 2101', '日本語の名前', 'Käfer 1303 🏁', 'O’Brien & Sons – #2']) expect(name.parse(ok)).toBe(ok);
		expect(name.parse('  spaced  ')).toBe('spaced');
		expect(name.safeParse('x'.repeat(21)).error!.issues[0]!.message).toBe('name: 1 to 20 characters');
		expect(name.safeParse('   ').error!.issues[0]!.message).toBe('name: 1 to 20 characters');
		expect(name.safeParse(42).error!.issues[0]!.message).toBe('name: text, 1 to 20 characters');
	});
});
