// Reading numbers out of URLs for the JSON routes: a malformed one is a 400 naming it, never a 500.
import { InputError } from '$lib/server/setups-documents';

const MUST = 'must be a revision number (a whole number from 1)';

function invalid(field: string) {
	return new InputError(`Invalid input. ${field}: ${MUST}`, [{ path: [field], message: MUST }]);
}

/** A revision number from a query value; `null` when it is absent. */
export function revisionNumberFrom(value: string | null | undefined, field: string): number | null {
	if (value === null || value === undefined || value === '') return null;
	if (!/^\d{1,9}$/.test(value) || Number(value) < 1) throw invalid(field);
	return Number(value);
}

/** A revision number from a path segment. */
export function requiredRevisionNumber(value: string, field = 'n'): number {
	const n = revisionNumberFrom(value, field);
	if (n === null) throw invalid(field);
	return n;
}
