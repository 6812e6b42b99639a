// The proof that a browser used a sign-in link for an address: only this app's secret makes one, it
// holds for one address, and it runs out.
import { describe, expect, it } from 'vitest';
import { SIGNIN_PROOF_DAYS, provesAddress, signInProof } from './signin-proof';

const secret = 'test-secret-of-this-app';
const email = 'mara.quill@fernhill.example';
const now = Date.UTC(2026, 11, 2, 12);
const day = 24 * 3600_000;

describe('sign-in proof', () => {
	it('proves the address it was made for, until it runs out', () => {
		const proof = signInProof(email, secret, now);
		expect(provesAddress(proof, email, secret, now)).toBe(true);
		expect(provesAddress(proof, email, secret, now + (SIGNIN_PROOF_DAYS - 1) * day)).toBe(true);
		expect(provesAddress(proof, email, secret, now + SIGNIN_PROOF_DAYS * day)).toBe(false);
	});

	it('proves nothing about another address', () => {
		const proof = signInProof(email, secret, now);
		expect(provesAddress(proof, 'operator@squarelaw.example', secret, now)).toBe(false);
	});

	it('is refused when made with another secret, altered, or not a proof at all', () => {
		const proof = signInProof(email, secret, now);
		expect(provesAddress(proof, email, 'another-secret', now)).toBe(false);
		expect(provesAddress(signInProof(email, 'another-secret', now), email, secret, now)).toBe(false);
		const [expires, mac] = proof.split('.');
		// A later expiry with the same MAC.
		expect(provesAddress(`${Number(expires) + 3600}.${mac}`, email, secret, now)).toBe(false);
		const flipped = mac.slice(0, -2) + (mac.at(-2) === 'A' ? 'B' : 'A') + mac.at(-1);
		expect(provesAddress(`${expires}.${flipped}`, email, secret, now)).toBe(false);
		for (const junk of [undefined, '', 'x', `${expires}.`, `${expires}.${mac}x`, `-1.${mac}`]) {
			expect(provesAddress(junk, email, secret, now), String(junk)).toBe(false);
		}
		expect(provesAddress(proof, email, undefined, now)).toBe(false);
	});
});
