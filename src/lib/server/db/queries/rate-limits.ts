import { and, count, eq, gt, lt, sql } from 'drizzle-orm';
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
 * Count and insert run in one transaction holding an advisory lock per bucket, so a burst of
 * simultaneous requests (on one app server or several) cannot all slip under the limit.
 */
export async function hitRateLimits(rules: RateRule[]): Promise<{ allowed: boolean; retryAfterS: number }> {
	const now = Date.now();
	const result = await db.transaction(async (tx) => {
		// Always lock in the same order, so two requests sharing buckets cannot deadlock.
		for (const bucket of [...new Set(rules.map((r) => r.bucket))].sort()) {
			await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${bucket}, 0))`);
		}
		for (const rule of rules) {
			const since = new Date(now - rule.windowMs);
			const [row] = await tx
				.select({ n: count() })
				.from(rateLimitHits)
				.where(and(eq(rateLimitHits.bucket, rule.bucket), gt(rateLimitHits.createdAt, since)));
			if ((row?.n ?? 0) >= rule.limit) return { allowed: false, retryAfterS: Math.ceil(rule.windowMs / 1000) };
		}
		await tx.insert(rateLimitHits).values(rules.map((r) => ({ bucket: r.bucket })));
		return { allowed: true, retryAfterS: 0 };
	});
	// Old rows are of no use; trim now and then.
	if (result.allowed && Math.random() < 0.02) {
		await db.delete(rateLimitHits).where(lt(rateLimitHits.createdAt, new Date(now - 24 * 3600_000)));
	}
	return result;
}
