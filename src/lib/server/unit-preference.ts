/**
 * The metric or imperial choice: the signed-in user's own (saved on the account page, and only there),
 * else a cookie. The calculator may show other units for itself (its own cookie), saying so, without
 * touching the account. Both cookies are written here only.
 */
import type { Cookies } from '@sveltejs/kit';
import type { UnitSystem } from '$lib/light/format';

export const UNITS_COOKIE = 'squarelaw-units';

export function isUnitSystem(v: unknown): v is UnitSystem {
	return v === 'metric' || v === 'imperial';
}

/** The signed-in user's choice wins; then the cookie; then metric. */
export function unitSystemFor(locals: App.Locals, cookies: Cookies): UnitSystem {
	const fromUser = locals.user?.unitSystem;
	if (isUnitSystem(fromUser)) return fromUser;
	const fromCookie = cookies.get(UNITS_COOKIE);
	return isUnitSystem(fromCookie) ? fromCookie : 'metric';
}

export function rememberUnitSystem(cookies: Cookies, units: UnitSystem) {
	// Readable by the page script (not httpOnly): it holds no secret, only a display preference.
	cookies.set(UNITS_COOKIE, units, { path: '/', httpOnly: false, sameSite: 'lax', maxAge: 365 * 24 * 3600 });
}

/** The calculator's own choice, for that page only: it never changes the account's. */
export const CALCULATOR_UNITS_COOKIE = 'squarelaw-calc-units';

/** The calculator's units: its own choice if one was made there, else the account's (or visitor's). */
export function calculatorUnitSystem(locals: App.Locals, cookies: Cookies): UnitSystem {
	const chosen = cookies.get(CALCULATOR_UNITS_COOKIE);
	return isUnitSystem(chosen) ? chosen : unitSystemFor(locals, cookies);
}

export function rememberCalculatorUnits(cookies: Cookies, units: UnitSystem) {
	cookies.set(CALCULATOR_UNITS_COOKIE, units, { path: '/calc', httpOnly: false, sameSite: 'lax', maxAge: 365 * 24 * 3600 });
}
