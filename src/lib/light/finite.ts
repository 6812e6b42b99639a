/**
 * JSON turns NaN and ±Infinity into null without a word. Before an answer leaves the server, this finds
 * any such number so the route can refuse the input instead of sending a silently broken result.
 */
export function findNonFinite(value: unknown, path: string[] = []): string[] | null {
	if (typeof value === 'number') return Number.isFinite(value) ? null : path;
	if (Array.isArray(value)) {
		for (let i = 0; i < value.length; i++) {
			const hit = findNonFinite(value[i], [...path, String(i)]);
			if (hit) return hit;
		}
		return null;
	}
	if (value && typeof value === 'object') {
		for (const [k, v] of Object.entries(value)) {
			const hit = findNonFinite(v, [...path, k]);
			if (hit) return hit;
		}
	}
	return null;
}
