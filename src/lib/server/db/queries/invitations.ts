// The life of an e-mailed invitation, a studio's or a workshop's (both tables share their columns:
// invitationColumns in schema/studios.ts): open until it is accepted, withdrawn or past its expiry.
import { and, gt, isNull, type SQL } from 'drizzle-orm';
import type { AnyPgColumn } from 'drizzle-orm/pg-core';

export type InvitationStanding = 'open' | 'used' | 'revoked' | 'expired';

/** Where an invitation stands now; the first that applies of used, withdrawn, expired. */
export function invitationStanding(inv: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date }): InvitationStanding {
	if (inv.acceptedAt) return 'used';
	if (inv.revokedAt) return 'revoked';
	if (inv.expiresAt.getTime() <= Date.now()) return 'expired';
	return 'open';
}

interface InvitationTable {
	acceptedAt: AnyPgColumn;
	revokedAt: AnyPgColumn;
	expiresAt: AnyPgColumn;
}

/** Neither accepted nor withdrawn (it may have expired). */
export const notAcceptedOrRevoked = (t: InvitationTable): SQL => and(isNull(t.acceptedAt), isNull(t.revokedAt))!;

/** Open: neither accepted nor withdrawn, and not expired. */
export const stillOpen = (t: InvitationTable): SQL => and(notAcceptedOrRevoked(t), gt(t.expiresAt, new Date()))!;
