// Seat prices in minor units: typed amounts read per currency, written back for the form and the reader.
// The minimums are the payment provider's documented smallest charges (docs: "Supported currencies",
// "Minimum and maximum charge amounts").
import { describe, expect, it } from 'vitest';
import { CURRENCIES, formatMoney, toMajorText, toMinorUnits } from './money';

describe('seat prices', () => {
	it('reads a typed amount in the currency’s minor units, with a point or a comma', () => {
		expect(toMinorUnits('25', 'eur')).toBe(2500);
		expect(toMinorUnits('25.5', 'eur')).toBe(2550);
		expect(toMinorUnits('25,05', 'gbp')).toBe(2505);
		expect(toMinorUnits(' 3000 ', 'jpy')).toBe(3000);
	});

	it('refuses what is not an amount in that currency', () => {
		expect(toMinorUnits('25.005', 'eur')).toBeNull();
		expect(toMinorUnits('12.5', 'jpy')).toBeNull();
		expect(toMinorUnits('-5', 'eur')).toBeNull();
		expect(toMinorUnits('1e3', 'usd')).toBeNull();
		expect(toMinorUnits('', 'usd')).toBeNull();
	});

	it('writes amounts back as typed and as read', () => {
		expect(toMajorText(2550, 'eur')).toBe('25.50');
		expect(toMajorText(3000, 'jpy')).toBe('3000');
		expect(formatMoney(1250, 'eur')).toBe('€12.50');
		expect(formatMoney(30, 'gbp')).toBe('£0.30');
		expect(formatMoney(3000, 'jpy')).toBe('JP¥3,000');
	});

	it('knows the smallest charge of each currency it offers', () => {
		expect(CURRENCIES.usd.minimumMinor).toBe(50);
		expect(CURRENCIES.gbp.minimumMinor).toBe(30);
		expect(CURRENCIES.jpy).toEqual({ minorDigits: 0, minimumMinor: 50 });
	});
});
