// A workshop to present and follow in the browser tests, of its own so a test can change it: the seeded
// quartz setup (Fernhill Geology Circle, owned by Mara Quill; its latest revision has the key, a white
// card and a black flag) duplicated through the API, and a lesson of three steps pinning that revision:
// the key light alone, key + card, key + card + flag.
// Workshops, lessons and steps are written straight into their tables (as the workshop pages would save
// them); people are signed in through the real mail flow.
import postgres from 'postgres';
import { randomUUID } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import type { APIRequestContext, Page } from '@playwright/test';
import { expect } from './fixtures';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) throw new Error('DATABASE_URL is not set: run the browser tests through `npm test`.');
/** A connection for one spec file (each ends its own in afterAll: the files share this module in one worker). */
export function openDb() {
	return postgres(databaseUrl!, { max: 2, onnotice: () => {} });
}
export type Db = ReturnType<typeof openDb>;

/** The seeded "Quartz cluster on black velvet" (src/lib/server/seed/notebook-data.ts). */
const QUARTZ_ID = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000001';

export const CAPTIONS = ['The key light alone, high at the upper left', 'Add the white card opposite', 'A black flag keeps the key off the velvet'];

export interface LiveWorld {
	workshopId: string;
	lessonId: string;
	stepIds: string[];
	setupId: string;
}

/** Builds the world as the signed-in owner (`request` carries Mara's session). */
export async function makeLiveWorld(sql: Db, request: APIRequestContext, title = 'Small Light, Big Detail (test)'): Promise<LiveWorld> {
	const dup = await request.post(`/api/v1/setups/${QUARTZ_ID}/duplicate`, { data: { subject: `Quartz cluster (live test ${randomUUID().slice(0, 8)})`, title: `Quartz cluster, live test ${randomUUID().slice(0, 8)}` } });
	expect(dup.status()).toBe(201);
	const setupId = ((await dup.json()) as { id: string }).id;
	// The duplicate's first revision is the seeded quartz's latest: the key, the white card and a black flag off the lens.
	const revision = 1;

	const [studio] = await sql`select studio_id from setups where id = ${setupId}`;
	const [workshop] = await sql`
		insert into workshops (studio_id, slug, title, capacity, state)
		values (${studio.studio_id}, ${'live-test-' + randomUUID().slice(0, 8)}, ${title}, 12, 'published') returning id`;
	const [lesson] = await sql`
		insert into workshop_lessons (workshop_id, position, title, student_notes, presenter_notes)
		values (${workshop.id}, 0, 'Building the light on a quartz cluster', 'Watch the shadow side.', 'Ask the hall which side is darker before adding the card.')
		returning id`;
	const hidden = [['card', 'flag'], ['flag'], []];
	const stepIds: string[] = [];
	for (let i = 0; i < 3; i++) {
		const [step] = await sql`
			insert into workshop_steps (lesson_id, position, setup_id, revision_number, hidden_element_ids, caption)
			values (${lesson.id}, ${i}, ${setupId}, ${revision}, ${hidden[i]}, ${CAPTIONS[i]}) returning id`;
		stepIds.push(step.id);
	}
	return { workshopId: workshop.id, lessonId: lesson.id, stepIds, setupId };
}

/** Makes a signed-in person a student of the workshop (as accepting an invitation does). */
export async function enrol(sql: Db, workshopId: string, email: string) {
	const [user] = await sql`select id from users where email = ${email}`;
	await sql`insert into workshop_members (workshop_id, user_id, role) values (${workshopId}, ${user.id}, 'student') on conflict do nothing`;
}

/** Serious and critical axe findings (WCAG 2.1 A and AA) on the page as it is now, as "rule: element". */
export async function accessibilityProblems(page: Page): Promise<string[]> {
	const { violations } = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
	return violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.flatMap((v) => v.nodes.map((n) => `${v.id}: ${n.target.join(' ')}`));
}
