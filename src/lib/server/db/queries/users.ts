import { eq } from 'drizzle-orm';
import { db } from '../index';
import { users } from '../schema';
import type { SessionUser, UnitSystem } from '$lib/server/session';

export function toSessionUser(row: typeof users.$inferSelect): SessionUser {
	return {
		id: row.id,
		name: row.name,
		email: row.email,
		isAdmin: row.isAdmin,
		unitSystem: row.unitSystem
	};
}

export async function getUserById(id: string): Promise<SessionUser | null> {
	const [row] = await db.select().from(users).where(eq(users.id, id));
	return row ? toSessionUser(row) : null;
}

export async function renameUser(id: string, name: string): Promise<void> {
	await db.update(users).set({ name }).where(eq(users.id, id));
}

export async function saveUnitPreference(id: string, unitSystem: UnitSystem): Promise<void> {
	await db.update(users).set({ unitSystem }).where(eq(users.id, id));
}
