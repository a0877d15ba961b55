import { describe, expect, it } from 'vitest';
import { sameOriginPath } from './redirect-target';

const origin = 'https://phasewright.example';

// What a browser makes of each Location: the WHATWG URL Standard's parser (tabs and newlines
// removed, "\" as "/" in http(s), "//" starting a host). Rows typed from that rule, and from the
// payloads of the hostile review in issue 14.
describe('where to go after signing in', () => {
	it.each([
		['/builds/42?tab=tapes#tdc', '/builds/42?tab=tapes#tdc'],
		['/invite/abc', '/invite/abc'],
		// Line breaks vanish in the parser: what is left is a path here, with nothing a header cannot carry.
		['/\nbuilds', '/builds'],
		['/x\r\ny', '/xy']
	])('keeps the path %j as %j', (raw, want) => {
		expect(sameOriginPath(raw, origin)).toBe(want);
	});

	it.each<[unknown, string]>([
		['/\t/evil.example/x', 'a tab between the slashes: the browser reads //evil.example'],
		['//evil.example/x', 'protocol-relative'],
		['/\\evil.example', 'a backslash is a slash in http(s)'],
		['\\\\evil.example', 'two backslashes'],
		['https://evil.example/builds', 'another origin'],
		['https://phasewright.example/builds', 'an absolute address, even our own: only paths are taken'],
		['\n', 'a bare line break (the %0a that gave a 500)'],
		['javascript:alert(1)', 'a script address'],
		['', 'empty'],
		[undefined, 'missing'],
		[['/builds'], 'not a string']
	])('sends %j to /builds (%s)', (raw: unknown) => {
		expect(sameOriginPath(raw, origin)).toBe('/builds');
	});

	it('never answers with a control character', () => {
		for (let code = 0; code < 0x20; code++) {
			expect(sameOriginPath(`/a${String.fromCharCode(code)}b`, origin)).not.toMatch(/[\u0000-\u001f]/);
		}
	});
});
