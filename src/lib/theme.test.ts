import { describe, expect, it } from 'vitest';
import { nextTheme, parseTheme } from './theme';

describe('theme choice', () => {
	it('cycles system, light, dark and back', () => {
		expect(nextTheme('system')).toBe('light');
		expect(nextTheme('light')).toBe('dark');
		expect(nextTheme('dark')).toBe('system');
	});

	it('falls back to system for anything unknown', () => {
		expect(parseTheme('dark')).toBe('dark');
		expect(parseTheme('neon')).toBe('system');
		expect(parseTheme(undefined)).toBe('system');
	});
});
