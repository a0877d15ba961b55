import { describe, expect, it } from 'vitest';
import { hostRefusal, isLoopback } from './origin';

const origin = 'https://phasewright.example';
const ask = (headers: Record<string, string>, more: { client?: string; path?: string; hostHeader?: string } = {}) =>
	hostRefusal(new Headers(headers), {
		origin,
		client: () => more.client ?? '203.0.113.9',
		path: more.path ?? '/signin',
		hostHeader: more.hostHeader
	});

describe('requests for another host name (DNS rebinding, links from headers)', () => {
	it('takes the configured host, in any case, with or without its default port', () => {
		expect(ask({ host: 'phasewright.example' })).toBeNull();
		expect(ask({ host: 'PhaseWright.Example' })).toBeNull();
		expect(ask({ host: 'phasewright.example:443' })).toBeNull();
		expect(ask({ host: 'phasewright.example', 'x-forwarded-host': 'phasewright.example', 'x-forwarded-proto': 'https' })).toBeNull();
	});

	it('refuses any other Host, a forwarded host or scheme that differs, and no Host at all', () => {
		expect(ask({ host: 'evil.example' })).toBe('Host');
		expect(ask({ host: 'phasewright.example.evil.example' })).toBe('Host');
		expect(ask({ host: 'phasewright.example:8443' })).toBe('Host');
		expect(ask({})).toBe('Host');
		expect(ask({ host: 'phasewright.example', 'x-forwarded-host': 'evil.example' })).toBe('X-Forwarded-Host');
		expect(ask({ host: 'phasewright.example', 'x-forwarded-proto': 'http' })).toBe('X-Forwarded-Proto');
	});

	it('reads the header HOST_HEADER names instead of Host when a proxy is configured so', () => {
		expect(ask({ host: 'app:3000', 'x-forwarded-host': 'phasewright.example' }, { hostHeader: 'X-Forwarded-Host' })).toBeNull();
		expect(ask({ host: 'phasewright.example', 'x-forwarded-host': 'evil.example' }, { hostHeader: 'X-Forwarded-Host' })).toBe('Host');
	});

	it('lets a health probe from this machine use any name, and nothing else', () => {
		expect(ask({ host: 'localhost:3000' }, { client: '127.0.0.1', path: '/api/health' })).toBeNull();
		expect(ask({ host: 'localhost:3000' }, { client: '::ffff:127.0.0.1', path: '/api/health' })).toBeNull();
		expect(ask({ host: 'localhost:3000' }, { client: '203.0.113.9', path: '/api/health' })).toBe('Host');
		expect(ask({ host: 'localhost:3000' }, { client: '127.0.0.1', path: '/dev/mail' })).toBe('Host');
	});

	it('knows loopback addresses (RFC 6890: 127.0.0.0/8 and ::1)', () => {
		for (const a of ['127.0.0.1', '127.1.2.3', '::1', '::ffff:127.0.0.1']) expect(isLoopback(a)).toBe(true);
		for (const a of ['10.0.0.1', '::', '128.0.0.1', '::ffff:10.0.0.1', '0.0.0.0', '127.0.0.1.evil']) expect(isLoopback(a)).toBe(false);
	});
});
