/**
 * Seat prices: the currencies a workshop may be priced in, their minor units and the smallest charge
 * the payment provider takes in each. Amounts are kept in minor units (cents, pence; yen have none).
 * Minimums: the provider's documentation, "Supported currencies", section "Minimum and maximum charge
 * amounts" (0.50 for the dollar and euro areas and the Swiss franc, 0.30 GBP, 2.50 DKK, 3.00 NOK and
 * SEK, 50 JPY).
 */
export const CURRENCIES = {
	eur: { minorDigits: 2, minimumMinor: 50 },
	usd: { minorDigits: 2, minimumMinor: 50 },
	gbp: { minorDigits: 2, minimumMinor: 30 },
	chf: { minorDigits: 2, minimumMinor: 50 },
	cad: { minorDigits: 2, minimumMinor: 50 },
	aud: { minorDigits: 2, minimumMinor: 50 },
	dkk: { minorDigits: 2, minimumMinor: 250 },
	nok: { minorDigits: 2, minimumMinor: 300 },
	sek: { minorDigits: 2, minimumMinor: 300 },
	jpy: { minorDigits: 0, minimumMinor: 50 }
} as const;

export type Currency = keyof typeof CURRENCIES;
export const CURRENCY_CODES = Object.keys(CURRENCIES) as Currency[];

/** The largest price taken for one seat, in major units (a guard against a slipped digit). */
export const MAX_PRICE_MAJOR = 100_000;

export const isCurrency = (code: string): code is Currency => Object.hasOwn(CURRENCIES, code);

/** "25.00 EUR" as the reader's locale writes it ("€25.00"). */
export function formatMoney(amountMinor: number, currency: string, locale = 'en-GB'): string {
	const digits = isCurrency(currency) ? CURRENCIES[currency].minorDigits : 2;
	return new Intl.NumberFormat(locale, { style: 'currency', currency: currency.toUpperCase(), minimumFractionDigits: digits, maximumFractionDigits: digits }).format(
		amountMinor / 10 ** digits
	);
}

/** A typed amount in major units ("25", "25.5", "25,50") in minor units; null when it is not one. */
export function toMinorUnits(typed: string, currency: Currency): number | null {
	const digits = CURRENCIES[currency].minorDigits;
	const m = /^(\d{1,9})(?:[.,](\d*))?$/.exec(typed.trim());
	if (!m) return null;
	const fraction = m[2] ?? '';
	if (fraction.length > digits) return null;
	return Number(m[1]) * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
}

/** Minor units back to the amount as typed in the form ("25.00"). */
export function toMajorText(amountMinor: number, currency: string): string {
	const digits = isCurrency(currency) ? CURRENCIES[currency].minorDigits : 2;
	return (amountMinor / 10 ** digits).toFixed(digits);
}
