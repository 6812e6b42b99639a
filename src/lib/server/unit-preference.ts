/**
 * The metric or imperial choice: the signed-in user's own (saved on the account), else a cookie, so a
 * visitor's choice on the calculator lasts too. The cookie is written here only.
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
