// Which studios' rows a caller may see, applied inside a query. Authz decides it (`studioFilter`).
import { and, eq, inArray, isNull, type SQL } from 'drizzle-orm';
import type { PgColumn } from 'drizzle-orm/pg-core';
import { db } from '../index';
import { memberships, studios, type StudioRole } from '../schema';

/**
 * The studios whose rows a caller may use, as authz answers it (`studioFilter`): every studio for a
 * site admin, else the live studios where the caller holds one of `roles`. Applied in the database, so a query
 * that lists setups or gear needs no separate look-up of the caller's studios.
 */
export type StudioFilter = 'all' | { userId: string; roles: StudioRole[] };

/** The condition that keeps rows whose `studioId` column the filter lets through. */
export function inStudiosOf(studioId: PgColumn, filter: StudioFilter): SQL | undefined {
	if (filter === 'all') return undefined;
	const theirs = db
		.select({ studioId: memberships.studioId })
		.from(memberships)
		.innerJoin(studios, eq(studios.id, memberships.studioId))
		.where(and(eq(memberships.userId, filter.userId), inArray(memberships.role, filter.roles), isNull(studios.deletedAt)));
	return inArray(studioId, theirs);
}
