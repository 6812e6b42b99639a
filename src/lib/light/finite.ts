/**
 * JSON turns NaN and ±Infinity into null without a word. Before an answer leaves the server, this finds
 * any such number so the route can refuse the input instead of sending a silently broken result.
 * The walk allocates nothing on the way; the path is built only for the value it finds.
 */
export function findNonFinite(value: unknown): string[] | null {
	const trail: string[] = [];
	return walk(value, trail) ? trail.reverse() : null;
}

function walk(value: unknown, trail: string[]): boolean {
	if (typeof value === 'number') return !Number.isFinite(value);
	if (value === null || typeof value !== 'object') return false;
	if (Array.isArray(value)) {
		for (let i = 0; i < value.length; i++) {
			if (walk(value[i], trail)) {
				trail.push(String(i));
				return true;
			}
		}
		return false;
	}
	for (const key in value) {
		if (walk((value as Record<string, unknown>)[key], trail)) {
			trail.push(key);
			return true;
		}
	}
	return false;
}
