import { and, count, eq, gt, lt } from 'drizzle-orm';
import { db } from '../index';
import { rateLimitHits } from '../schema';

export interface RateRule {
	bucket: string;
	limit: number;
	windowMs: number;
}

/**
 * Counts this request against every rule and says whether any rule is over its limit.
 * A refused request is not counted, so waiting out the window always works.
 */
export async function hitRateLimits(rules: RateRule[]): Promise<{ allowed: boolean; retryAfterS: number }> {
	const now = Date.now();
	for (const rule of rules) {
		const since = new Date(now - rule.windowMs);
		const [row] = await db
			.select({ n: count() })
			.from(rateLimitHits)
			.where(and(eq(rateLimitHits.bucket, rule.bucket), gt(rateLimitHits.createdAt, since)));
		if ((row?.n ?? 0) >= rule.limit) return { allowed: false, retryAfterS: Math.ceil(rule.windowMs / 1000) };
	}
	await db.insert(rateLimitHits).values(rules.map((r) => ({ bucket: r.bucket })));
	// Old rows are of no use; trim now and then.
	if (Math.random() < 0.02) {
		await db.delete(rateLimitHits).where(lt(rateLimitHits.createdAt, new Date(now - 24 * 3600_000)));
	}
	return { allowed: true, retryAfterS: 0 };
}
