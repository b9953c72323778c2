import { describe, expect, it } from 'vitest';
import { isLocalRequest, isLoopback } from './operator';

const event = (address: string, headers: Record<string, string> = {}) => ({
	getClientAddress: () => address,
	request: new Request('http://localhost/dev/mail', { headers })
});

describe('the operator is this machine, not a visitor relayed through it', () => {
	it('knows the loopback addresses (RFC 1122 §3.2.1.3: 127/8; RFC 4291 §2.5.3: ::1; RFC 4291 §2.5.5.2: mapped)', () => {
		for (const a of ['127.0.0.1', '127.8.9.10', '::1', '::ffff:127.0.0.1'])
			expect(isLoopback(a), a).toBe(true);
		for (const a of [
			'10.0.0.1',
			'128.0.0.1',
			'::2',
			'::ffff:10.0.0.1',
			'1127.0.0.1',
			'127.0.0.1.evil',
			''
		]) {
			expect(isLoopback(a), a).toBe(false);
		}
	});

	it('refuses loopback requests that a proxy relayed, and addresses it cannot read', () => {
		expect(isLocalRequest(event('127.0.0.1'))).toBe(true);
		expect(isLocalRequest(event('203.0.113.7'))).toBe(false);
		for (const h of ['x-forwarded-for', 'forwarded', 'x-real-ip', 'via']) {
			expect(isLocalRequest(event('127.0.0.1', { [h]: '203.0.113.7' })), h).toBe(false);
		}
		expect(
			isLocalRequest({
				...event(''),
				getClientAddress: () => {
					throw new Error('no address');
				}
			})
		).toBe(false);
	});
});
