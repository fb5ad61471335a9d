import { describe, expect, it } from 'vitest';
import { requestIdOf, requestLine } from './log';

describe('requestIdOf', () => {
	it('keeps a proxy’s request id that looks like one, else makes a new one', () => {
		expect(requestIdOf('3f2a9c1e-proxy-42')).toBe('3f2a9c1e-proxy-42');
		for (const bad of [
			null,
			'',
			'short',
			'has spaces in it',
			'x'.repeat(129),
			'a\nb-injected-line'
		]) {
			const id = requestIdOf(bad);
			expect(id).not.toBe(bad);
			expect(id).toMatch(/^[0-9a-f-]{36}$/);
		}
	});
});

describe('requestLine', () => {
	it('names the route, never the path with its values, and nothing personal', () => {
		const line = requestLine({
			requestId: 'abcdefgh-1',
			method: 'GET',
			routeId: '/chair/shows/[slug]/results',
			status: 200,
			ms: 12.345,
			signedIn: true
		});
		expect(line).toEqual({
			msg: 'request',
			requestId: 'abcdefgh-1',
			method: 'GET',
			route: '/chair/shows/[slug]/results',
			status: 200,
			ms: 12.3,
			signedIn: true
		});
		// No field for addresses, names, query strings, cookies or client addresses exists.
		expect(Object.keys(line).sort()).toEqual(
			['method', 'ms', 'msg', 'requestId', 'route', 'signedIn', 'status'].sort()
		);
		expect(
			requestLine({
				...line,
				routeId: null,
				requestId: 'abcdefgh-2',
				ms: 1,
				signedIn: false
			} as never)
		).toMatchObject({
			route: '(no route)'
		});
	});
});
