// The demo: the Fernhill Geology Circle (an invented club, see BRIEF.md). Idempotent: running it again
// changes nothing that is already there.
import { and, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { memberships, studios, users, type StudioRole } from '$lib/server/db/schema';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import { seedNotebook } from './notebook';
import { DEMO_STUDENT, seedWorkshop } from './workshop';

export const CLUB_STUDIO_ID = '0f3e8a52-6d1b-4c8e-9a51-2f7c0d4b9e11';
export const CLUB_STUDIO_NAME = 'Fernhill Geology Circle';

export const DEMO_USERS: { email: string; name: string; role: StudioRole; isAdmin?: boolean }[] = [
	{ email: 'mara.quill@fernhill.example', name: 'Mara Quill', role: 'owner' },
	{ email: 'tobias.wren@fernhill.example', name: 'Tobias Wren', role: 'editor' },
	{ email: 'ines.marlow@fernhill.example', name: 'Ines Marlow', role: 'viewer' },
	{ email: 'operator@squarelaw.example', name: 'Site Operator', role: 'viewer', isAdmin: true }
];

export async function seedDemo() {
	const seeded: { email: string; name: string; role: string; studio: string }[] = [];
	await db
		.insert(studios)
		.values({ id: CLUB_STUDIO_ID, name: CLUB_STUDIO_NAME })
		.onConflictDoNothing({ target: studios.id });
	for (const demo of DEMO_USERS) {
		const [user] = await db
			.insert(users)
			.values({ email: demo.email, name: demo.name, emailVerified: new Date(), isAdmin: demo.isAdmin ?? false })
			.onConflictDoUpdate({ target: users.email, set: { name: demo.name } })
			.returning();
		await ensurePersonalStudio(user.id, demo.name.split(' ')[0]);
		if (!demo.isAdmin) {
			const [member] = await db
				.select()
				.from(memberships)
				.where(and(eq(memberships.studioId, CLUB_STUDIO_ID), eq(memberships.userId, user.id)));
			if (!member) await db.insert(memberships).values({ studioId: CLUB_STUDIO_ID, userId: user.id, role: demo.role });
		}
		seeded.push({
			email: demo.email,
			name: demo.name,
			role: demo.isAdmin ? 'site admin' : demo.role,
			studio: demo.isAdmin ? 'every studio' : CLUB_STUDIO_NAME
		});
	}
	const notebook = await seedNotebook(CLUB_STUDIO_ID);
	const workshop = await seedWorkshop(CLUB_STUDIO_ID);
	seeded.push({ email: DEMO_STUDENT.email, name: DEMO_STUDENT.name, role: 'student', studio: `the workshop "${workshop.title}"` });
	return { users: seeded, notebook, workshop };
}
