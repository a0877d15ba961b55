import { describe, expect, it } from 'vitest';
import { palette } from '../../../tailwind.config';
import { createHash } from 'node:crypto';
import { isUnavailable, unavailablePage, unavailablePagePolicy } from './unavailable';

const withCode = (message: string, code: string) => Object.assign(new Error(message), { code });
/** How Drizzle hands on a driver error: its own error, the driver's as `cause`. */
const wrapped = (cause: unknown) => new Error('Failed query: select 1', { cause });

describe('isUnavailable', () => {
	// SQLSTATEs from PostgreSQL's documentation, Appendix A (error codes).
	it('knows the server going away by its SQLSTATE, even wrapped', () => {
		expect(isUnavailable(wrapped(withCode('terminating connection due to administrator command', '57P01')))).toBe(true);
		expect(isUnavailable(wrapped(withCode('the database system is starting up', '57P03')))).toBe(true);
		expect(isUnavailable(withCode('sorry, too many clients already', '53300'))).toBe(true);
		expect(isUnavailable(withCode('connection failure', '08006'))).toBe(true);
	});

	// Node's socket error codes (Node.js documentation, "Common system errors").
	it('knows a refused or reset socket, also inside an AggregateError', () => {
		expect(isUnavailable(wrapped(withCode('connect ECONNREFUSED 127.0.0.1:54329', 'ECONNREFUSED')))).toBe(true);
		expect(isUnavailable(new AggregateError([withCode('connect ECONNREFUSED ::1:5432', 'ECONNREFUSED')], ''))).toBe(true);
		expect(isUnavailable(withCode('read ECONNRESET', 'ECONNRESET'))).toBe(true);
	});

	// The messages node-postgres raises without a code (pg/lib/client.js, pg-pool/index.js).
	it("knows the driver's code-less messages for a dropped connection and a timed-out wait", () => {
		for (const message of [
			'Connection terminated unexpectedly',
			'timeout exceeded when trying to connect',
			'Connection terminated due to connection timeout',
			'Client has encountered a connection error and is not queryable'
		]) {
			expect(isUnavailable(wrapped(new Error(message))), message).toBe(true);
		}
	});

	it('leaves real faults and refusals alone: they are not outages', () => {
		expect(isUnavailable(wrapped(withCode('duplicate key value violates unique constraint', '23505')))).toBe(false);
		expect(isUnavailable(wrapped(withCode('write refused', 'P0001')))).toBe(false);
		expect(isUnavailable(new TypeError("Cannot read properties of undefined (reading 'id')"))).toBe(false);
		expect(isUnavailable('ECONNREFUSED')).toBe(false);
		expect(isUnavailable(undefined)).toBe(false);
	});

	it('stops on an error that is its own cause', () => {
		const loop = new Error('loop') as Error & { cause?: unknown };
		loop.cause = loop;
		expect(isUnavailable(loop)).toBe(false);
	});
});

describe('unavailablePage', () => {
	it("takes its colours from the palette and the visitor's theme", () => {
		const dark = unavailablePage('dark');
		expect(dark).toContain('data-theme="dark"');
		expect(dark).toContain(`--pw-ink:${palette.ink.dark}`);
		expect(dark).toContain(`--pw-paper:${palette.paper.light}`);
		expect(unavailablePage(undefined)).toContain('data-theme="system"');
		// Whatever the cookie held, only the three known values reach the page.
		expect(unavailablePage('"><script>')).toContain('data-theme="system"');
	});

	// CSP Level 3 (W3C), "hash-source": the base64 SHA-256 of the inline style element's text.
	it('lets its inline style through its own policy by hash, and nothing else', () => {
		const html = unavailablePage('light');
		const inline = /<style>([\s\S]*?)<\/style>/.exec(html)![1]!;
		const hash = createHash('sha256').update(inline, 'utf8').digest('base64');
		expect(unavailablePagePolicy).toContain(`style-src 'sha256-${hash}'`);
		expect(unavailablePagePolicy).toMatch(/^default-src 'none';/);
		expect(html).not.toMatch(/<script|style="/);
	});
});
