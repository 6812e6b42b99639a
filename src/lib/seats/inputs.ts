/**
 * The seat inputs: a workshop's price (one zod schema, shared by the workshop page's form and the
 * service). An empty or zero amount makes the workshop free.
 */
import { z } from 'zod';
import { CURRENCIES, CURRENCY_CODES, MAX_PRICE_MAJOR, formatMoney, isCurrency, toMinorUnits } from './money';

export const priceSchema = z
	.object({
		amount: z.string({ error: 'Give the price as a number, e.g. 25.00.' }).trim().max(20, 'Give the price as a number, e.g. 25.00.'),
		currency: z
			.string({ error: 'Choose a currency.' })
			.trim()
			.toLowerCase()
			.refine(isCurrency, { error: `Choose one of the currencies offered (${CURRENCY_CODES.map((c) => c.toUpperCase()).join(', ')}).` })
	})
	.transform((v, ctx) => {
		const currency = v.currency as keyof typeof CURRENCIES;
		if (v.amount === '') return { priceMinor: 0, currency };
		const minor = toMinorUnits(v.amount, currency);
		const digits = CURRENCIES[currency].minorDigits;
		if (minor === null) {
			ctx.addIssue({
				code: 'custom',
				path: ['amount'],
				message: digits ? `Give the price as a number with at most ${digits} decimals, e.g. 25.00.` : 'Give the price as a whole number.'
			});
			return z.NEVER;
		}
		if (minor > 0 && minor < CURRENCIES[currency].minimumMinor) {
			ctx.addIssue({
				code: 'custom',
				path: ['amount'],
				message: `The price is below the smallest payment taken in ${currency.toUpperCase()}: at least ${formatMoney(CURRENCIES[currency].minimumMinor, currency)}, or 0 for a free workshop.`
			});
			return z.NEVER;
		}
		if (minor > MAX_PRICE_MAJOR * 10 ** digits) {
			ctx.addIssue({ code: 'custom', path: ['amount'], message: `A seat costs at most ${formatMoney(MAX_PRICE_MAJOR * 10 ** digits, currency)}.` });
			return z.NEVER;
		}
		return { priceMinor: minor, currency };
	});
export type PriceInput = z.output<typeof priceSchema>;
