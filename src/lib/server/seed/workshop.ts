// The club's evening workshop, "Small Light, Big Detail" (invented, see BRIEF.md): one lesson that builds
// the quartz cluster up light by light from its fifth revision, published, with one invited student;
// and its spring evening, open to anyone for a paid seat, its lessons still to be written.
// Idempotent: fixed ids, and rows already there are left as they are.
import { eq } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import { exercises, users, workshopInvitations, workshopLessons, workshopMembers, workshopSessions, workshopSteps, workshops } from '$lib/server/db/schema';
import { hashSecret } from '$lib/server/tokens';
import { DEMO_SETUP_IDS } from './notebook-data';

export const DEMO_WORKSHOP_ID = '7b2c4e90-1a3f-4d6b-8e25-6c0f00000001';
export const DEMO_WORKSHOP_SLUG = 'small-light-big-detail';
export const DEMO_LESSON_ID = '7b2c4e90-1a3f-4d6b-8e25-6c0f00000101';
export const DEMO_STEP_IDS = [
	'7b2c4e90-1a3f-4d6b-8e25-6c0f00000201',
	'7b2c4e90-1a3f-4d6b-8e25-6c0f00000202',
	'7b2c4e90-1a3f-4d6b-8e25-6c0f00000203'
];
/** The spring evening: paid seats (booked on its public page through the payment fake), no lessons yet. */
export const DEMO_PAID_WORKSHOP_ID = '7b2c4e90-1a3f-4d6b-8e25-6c0f00000002';
export const DEMO_PAID_WORKSHOP_SLUG = 'small-light-spring-evening';
/** A newcomer to the club, in no studio of it: she reads the workshop as a student only. */
export const DEMO_STUDENT = { email: 'pebble.finch@fernhill.example', name: 'Pebble Finch' };

const SUMMARY = [
	'An evening at the community hall for members who photograph the collection, or want to.',
	'',
	// One line per paragraph: the notes render a single line break as a break.
	'We light one quartz cluster on black velvet with **one small flash**, a white card and a black flag, and watch what each adds on the projector. Bring a camera with a macro lens if you have one; the club lends tripods and flashes.'
].join('\n');

const SPRING_SUMMARY = [
	'The January evening again, for anyone who missed it: one quartz cluster, one small flash, a white card and a black flag.',
	'',
	'Seats are paid when booked and refunded if the evening is cancelled. The club lends tripods and flashes; bring a camera with a macro lens if you have one.'
].join('\n');

const STUDENT_NOTES = [
	'Three steps on one setup: the key light alone, then a white card to open the shadows, then a black flag that keeps the key off the lens.',
	'',
	'Watch the lighting ratio change when the card goes in, and the exposure **not** change when the flag does.'
].join('\n');

const PRESENTER_NOTES = [
	'Start with the hall lights down. Ask who has seen flare on a black background before the flag goes in.',
	'',
	'Step 2: move the card 8 cm closer live and read the ratio out loud. Step 3: the number stays; show the test frames.'
].join('\n');

const STEPS = [
	{ hidden: ['card', 'flag'], caption: 'The key light alone: a 30 cm softbox high at the upper left. The shadow side of the cluster falls to black.' },
	{ hidden: ['flag'], caption: 'Add a white card opposite: it returns some of the key into the shadows and the lighting ratio drops.' },
	{ hidden: [], caption: 'Add a black flag between the softbox and the lens: the exposure stays, the veiling flare goes.' }
];

export const DEMO_EXERCISE_ID = '7b2c4e90-1a3f-4d6b-8e25-6c0f00000301';

const EXERCISE_BRIEF = [
	'Light the quartz cluster so the **crystal faces** read as separate planes against the velvet.',
	'',
	'- Start from the key light and the card of the lesson.',
	'- Move the card (or the key) until the key is about **3:1** over the fill.',
	'- Stay between f/11 and f/22, and use at most two lights (cards do not count).',
	'',
	'Hand in your saved plan, one or two test frames, and a note on what you changed.'
].join('\n');

/** The workshop's evening at the hall, 18:30 to 21:00 UTC on `day`, unless it has a session already. */
async function sessionOnce(tx: Tx, workshopId: string, day: string) {
	const [existing] = await tx.select({ id: workshopSessions.id }).from(workshopSessions).where(eq(workshopSessions.workshopId, workshopId));
	if (existing) return;
	await tx.insert(workshopSessions).values({
		workshopId,
		startsAt: new Date(`${day}T18:30:00Z`),
		endsAt: new Date(`${day}T21:00:00Z`),
		place: 'Fernhill Community Hall, the back room'
	});
}

export async function seedWorkshop(studioId: string) {
	const [mara] = await db.select({ id: users.id }).from(users).where(eq(users.email, 'mara.quill@fernhill.example'));
	if (!mara) throw new Error('seed: demo user mara.quill@fernhill.example is missing; seed the users first');
	const [student] = await db
		.insert(users)
		.values({ email: DEMO_STUDENT.email, name: DEMO_STUDENT.name, emailVerified: new Date() })
		.onConflictDoUpdate({ target: users.email, set: { name: DEMO_STUDENT.name } })
		.returning();

	await db.transaction(async (tx) => {
		await tx
			.insert(workshops)
			.values({
				id: DEMO_WORKSHOP_ID,
				studioId,
				slug: DEMO_WORKSHOP_SLUG,
				title: 'Small Light, Big Detail',
				summary: SUMMARY,
				capacity: 12,
				state: 'published',
				createdById: mara.id,
				createdAt: new Date('2026-11-04T19:00:00Z'),
				updatedAt: new Date('2026-11-04T19:00:00Z')
			})
			.onConflictDoNothing({ target: workshops.id });
		await sessionOnce(tx, DEMO_WORKSHOP_ID, '2027-01-14');
		await tx
			.insert(workshopLessons)
			.values({ id: DEMO_LESSON_ID, workshopId: DEMO_WORKSHOP_ID, position: 0, title: 'One flash, one card, one flag', studentNotes: STUDENT_NOTES, presenterNotes: PRESENTER_NOTES })
			.onConflictDoNothing({ target: workshopLessons.id });
		await tx
			.insert(workshopSteps)
			.values(
				STEPS.map((s, i) => ({
					id: DEMO_STEP_IDS[i],
					lessonId: DEMO_LESSON_ID,
					position: i,
					setupId: DEMO_SETUP_IDS.quartz,
					revisionNumber: 5,
					hiddenElementIds: s.hidden,
					caption: s.caption
				}))
			)
			.onConflictDoNothing({ target: workshopSteps.id });
		await tx
			.insert(exercises)
			.values({
				id: DEMO_EXERCISE_ID,
				workshopId: DEMO_WORKSHOP_ID,
				lessonId: DEMO_LESSON_ID,
				title: 'Faces of the quartz at 3:1',
				brief: EXERCISE_BRIEF,
				setupId: DEMO_SETUP_IDS.quartz,
				revisionNumber: 5,
				dueAt: new Date('2027-01-28T21:00:00Z'),
				targets: [
					{ kind: 'lightingRatio', min: 2.5, max: 4 },
					{ kind: 'aperture', min: 11, max: 22 },
					{ kind: 'lightCount', max: 2 }
				],
				createdById: mara.id,
				createdAt: new Date('2026-11-04T19:10:00Z'),
				updatedAt: new Date('2026-11-04T19:10:00Z')
			})
			.onConflictDoNothing({ target: exercises.id });
		await tx
			.insert(workshops)
			.values({
				id: DEMO_PAID_WORKSHOP_ID,
				studioId,
				slug: DEMO_PAID_WORKSHOP_SLUG,
				title: 'Small Light, Big Detail: the spring evening',
				summary: SPRING_SUMMARY,
				capacity: 10,
				state: 'published',
				priceMinor: 1800,
				currency: 'eur',
				createdById: mara.id,
				createdAt: new Date('2026-11-20T19:00:00Z'),
				updatedAt: new Date('2026-11-20T19:00:00Z')
			})
			.onConflictDoNothing({ target: workshops.id });
		await sessionOnce(tx, DEMO_PAID_WORKSHOP_ID, '2027-03-18');
		const joined = await tx
			.insert(workshopMembers)
			.values({ workshopId: DEMO_WORKSHOP_ID, userId: student.id, role: 'student', joinedAt: new Date('2026-11-05T09:12:00Z') })
			.onConflictDoNothing()
			.returning();
		if (joined.length) {
			// The invitation she accepted (its link is long used; only a hash was ever kept).
			await tx.insert(workshopInvitations).values({
				workshopId: DEMO_WORKSHOP_ID,
				email: DEMO_STUDENT.email,
				role: 'student',
				tokenHash: hashSecret(`demo-invitation-${student.id}`),
				invitedById: mara.id,
				expiresAt: new Date('2026-11-18T19:05:00Z'),
				acceptedAt: new Date('2026-11-05T09:12:00Z'),
				acceptedById: student.id,
				createdAt: new Date('2026-11-04T19:05:00Z')
			});
		}
	});
	return { title: 'Small Light, Big Detail', student: DEMO_STUDENT.email };
}
