// Small statistics shared by the benchmarks in scripts/bench/.

/** The middle value (the upper one of the two middles for an even count). */
export function median(xs) {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

/** The value below which a fraction `p` of `xs` falls (nearest rank). */
export function percentile(xs, p) {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.floor(s.length * p))];
}

/** Two decimal places, for reports. */
export const round = (x) => Math.round(x * 100) / 100;
