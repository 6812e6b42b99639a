import { eq } from 'drizzle-orm';
import { db } from '../index';
import { sessions } from '../schema';

/** Ends every browser session of a user ("sign out everywhere"); returns how many there were. */
export async function deleteSessionsOfUser(userId: string): Promise<number> {
	const rows = await db.delete(sessions).where(eq(sessions.userId, userId)).returning({ userId: sessions.userId });
	return rows.length;
}
