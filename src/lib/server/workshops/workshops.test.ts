// Workshop rules on the real database and the mail fake: details that would break a rule change
// nothing and name the field; steps pin revisions the instructor can see; a reorder is whole or
// nothing; invitations go out to the good addresses of a list; seats are never oversold; a student's
// copy of a step keeps its lineage.
import { afterAll, describe, expect, it } from 'vitest';
import { count, eq } from 'drizzle-orm';

if (!process.env.DATABASE_URL || !process.env.DEV_MAIL_URL || !process.env.TEST_BASE_URL) {
	throw new Error('DATABASE_URL, DEV_MAIL_URL and TEST_BASE_URL are not set: run these tests through `npm test`.');
}

const { client, db } = await import('$lib/server/db');
const { workshopInvitations, workshopMembers, workshopSteps, workshops } = await import('$lib/server/db/schema');
const ws = await import('$lib/server/workshops');
const setupsService = await import('$lib/server/setups');
const { attempt } = await import('$lib/server/testing/authz-world');
const { addWorkshopMember, makeWorkshopWorld } = await import('$lib/server/testing/workshop-world');
const { address, context, makeStudio, makeUser, mailsTo } = await import('$lib/server/testing/studio-world');
const { sessionSchema, stepCreateSchema, workshopDetailsSchema, lessonSchema } = await import('$lib/workshops/inputs');
const { parseAddressText } = await import('$lib/workshops/addresses');
const { createSetup } = setupsService;
const { setupCreateSchema } = await import('$lib/scene/inputs');
const { sampleDocument } = await import('$lib/server/testing/notebook-fixtures');

afterAll(async () => {
	await client.end({ timeout: 5 });
});

async function ruleField(work: () => Promise<unknown>) {
	const got = await attempt(work);
	expect(got.outcome).toBe('rule');
	return got.error as { field: string; message: string; status: number };
}

const details = (over: Partial<Record<string, unknown>> = {}) =>
	workshopDetailsSchema.parse({ title: 'Small Light, Big Detail', summary: 'An evening.', capacity: 12, state: 'draft', ...over });

async function stepOrder(lessonId: string) {
	return (await db.select({ id: workshopSteps.id, position: workshopSteps.position }).from(workshopSteps).where(eq(workshopSteps.lessonId, lessonId)))
		.sort((a, b) => a.position - b.position)
		.map((r) => r.id);
}

/** The join token as the invitee reads it in the mail fake. */
async function joinLink(email: string): Promise<string> {
	for (let i = 0; i < 50; i++) {
		const messages = (await (await fetch(`${process.env.DEV_MAIL_URL}/messages`)).json()) as { to: string; text: string }[];
		const hit = messages.find((m) => m.to.includes(email) && m.text.includes('/workshops/join/'));
		if (hit) return hit.text.match(/\/workshops\/join\/(\S+)/)![1];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no workshop invitation to ${email}`);
}

describe('workshop details', () => {
	it('a capacity below the students enrolled is refused, naming the field, and nothing of the form is saved', async () => {
		const w = await makeWorkshopWorld({ capacity: 3 });
		await addWorkshopMember(w.workshopId, await makeUser('ines.marlow'), 'student');
		const e = await ruleField(() => ws.updateWorkshop(w.owner, w.workshopId, details({ title: 'Renamed', capacity: 1 })));
		expect(e.field).toBe('capacity');
		expect(e.message).toMatch(/2 students are already enrolled/);
		const [row] = await db.select().from(workshops).where(eq(workshops.id, w.workshopId));
		expect(row.title).toBe('Small Light, Big Detail');
		expect(row.capacity).toBe(3);
		await ws.updateWorkshop(w.owner, w.workshopId, details({ capacity: 2, state: 'published' }));
		expect((await ws.workshopOverview(w.student, w.workshopId)).seatsLeft).toBe(0);
	});

	it('publishing needs a dated session; the last session of a published workshop stays', async () => {
		const { studioId, people } = await makeStudio(['owner']);
		const owner = people[0].user;
		const created = await ws.createWorkshop(owner, { studioId, title: 'Small Light, Big Detail', summary: '', capacity: 10 });
		expect(created.slug).toMatch(/^small-light-big-detail-[0-9a-f]{6}$/);
		expect((await ruleField(() => ws.updateWorkshop(owner, created.id, details({ state: 'published' })))).field).toBe('state');
		const session = await ws.addSession(owner, created.id, sessionSchema.parse({ startsAt: '2027-01-14T18:30:00Z', endsAt: '2027-01-14T21:00:00Z', place: 'Hall' }));
		await ws.updateWorkshop(owner, created.id, details({ capacity: 10, state: 'published' }));
		expect((await ruleField(() => ws.removeSession(owner, created.id, session.id))).field).toBe('session');
		const pub = await ws.publicWorkshop(null, created.slug);
		expect(pub).toMatchObject({ title: 'Small Light, Big Detail', seatsLeft: 10, viewer: 'anonymous', sessions: [{ place: 'Hall' }] });
		await ws.updateWorkshop(owner, created.id, details({ capacity: 10, state: 'archived' }));
		expect((await attempt(() => ws.publicWorkshop(null, created.slug))).outcome).toBe(404);
	});

	it('invalid dates name their field', () => {
		const flipped = sessionSchema.safeParse({ startsAt: '2027-01-14T21:00:00Z', endsAt: '2027-01-14T18:30:00Z', place: 'Hall' });
		expect(flipped.success).toBe(false);
		expect(flipped.error!.issues[0]).toMatchObject({ path: ['endsAt'], message: 'The end must come after the start.' });
		const nonsense = sessionSchema.safeParse({ startsAt: '2027-02-30T25:00', endsAt: '2027-01-14T18:30:00Z', place: 'Hall' });
		expect(nonsense.error!.issues[0].path).toEqual(['startsAt']);
		const noPlace = sessionSchema.safeParse({ startsAt: '2027-01-14T18:30:00Z', endsAt: '2027-01-14T21:00:00Z', place: ' ' });
		expect(noPlace.error!.issues[0].path).toEqual(['place']);
	});
});

describe('steps', () => {
	it('a revision that does not exist, a setup out of sight or an element the revision lacks is refused, naming the field, and no step is added', async () => {
		const w = await makeWorkshopWorld();
		const elsewhere = await makeStudio(['owner']);
		const hidden = await createSetup(elsewhere.people[0].user, setupCreateSchema.parse({ studioId: elsewhere.studioId, title: 'Not yours', subject: 'x', document: sampleDocument() }));
		const before = await stepOrder(w.lessonId);
		const cases: [Record<string, unknown>, string][] = [
			[{ setupId: w.setupId, revisionNumber: 9 }, 'revisionNumber'],
			[{ setupId: hidden.id }, 'setupId'],
			[{ setupId: '00000000-0000-4000-8000-000000000000' }, 'setupId'],
			[{ setupId: w.setupId, hiddenElementIds: ['card', 'softbox'] }, 'hiddenElementIds']
		];
		for (const [input, field] of cases) {
			const e = await ruleField(() => ws.addStep(w.owner, w.workshopId, w.lessonId, stepCreateSchema.parse(input)));
			expect(e.field).toBe(field);
		}
		expect(await stepOrder(w.lessonId)).toEqual(before);
	});

	it('reorders in one go; a step of another lesson, a missing or a repeated one moves nothing', async () => {
		const w = await makeWorkshopWorld();
		const other = await ws.addLesson(w.owner, w.workshopId, lessonSchema.parse({ title: 'Second lesson' }));
		const foreign = await ws.addStep(w.owner, w.workshopId, other.id, stepCreateSchema.parse({ setupId: w.setupId }));
		// The workshop page counts each lesson's own steps.
		expect((await ws.workshopOverview(w.owner, w.workshopId)).lessons.map((l) => [l.title, l.stepCount]).sort()).toEqual([
			['Second lesson', 1],
			[(await ws.lessonForViewer(w.owner, w.workshopId, w.lessonId)).lesson.title, 2]
		].sort());
		const [a, b] = w.stepIds;
		for (const order of [[b, foreign.id], [a, b, foreign.id], [a], [a, a]]) {
			const e = await ruleField(() => ws.reorderSteps(w.owner, w.workshopId, w.lessonId, order));
			expect(e.field).toBe('stepIds');
			expect(await stepOrder(w.lessonId)).toEqual([a, b]);
		}
		await ws.reorderSteps(w.instructor, w.workshopId, w.lessonId, [b, a]);
		expect(await stepOrder(w.lessonId)).toEqual([b, a]);
		const lesson = await ws.lessonForViewer(w.student, w.workshopId, w.lessonId);
		expect(lesson.steps.map((s) => s.caption)).toEqual(['Key and card', 'The key alone']);
	});

	it('"use the latest revision" pins the newest, keeps what is hidden, and the exposure follows (half to full power: +1 stop)', async () => {
		const w = await makeWorkshopWorld();
		const pinned = await ws.stepForViewer(w.owner, w.stepIds[0]);
		expect(pinned.latestRevision).toBe(2);
		const moved = await ws.useLatestRevision(w.owner, w.stepIds[0]);
		expect(moved.revisionNumber).toBe(2);
		expect(moved.hiddenElementIds).toEqual(['card']);
		// Revision 2 doubles the key's power (0.25 → 0.5): one stop more (inverse-square and power are linear; common practice).
		expect(moved.exposure!.total.exposureOffsetStops! - pinned.exposure!.total.exposureOffsetStops!).toBeCloseTo(1, 6);
		const shown = await ws.updateStep(w.owner, w.stepIds[0], { hiddenElementIds: [], caption: 'Both now' });
		expect(shown.visibleElementIds).toEqual(['key', 'card']);
		expect((await ruleField(() => ws.updateStep(w.owner, w.stepIds[0], { revisionNumber: 7 }))).field).toBe('revisionNumber');
	});
});

describe('the live position', () => {
	it('instructors move it to a step of this workshop; followers read it; another workshop’s step is refused', async () => {
		const w = await makeWorkshopWorld();
		const other = await makeWorkshopWorld();
		expect(await ws.getLiveStep(w.student, w.workshopId)).toBeNull();
		const live = await ws.setLiveStep(w.instructor, w.workshopId, w.stepIds[1]);
		expect(live).toMatchObject({ lessonId: w.lessonId, stepId: w.stepIds[1] });
		expect(await ws.getLiveStep(w.student, w.workshopId)).toEqual(live);
		expect((await ruleField(() => ws.setLiveStep(w.owner, w.workshopId, other.stepIds[0]))).field).toBe('stepId');
		expect((await ws.getLiveStep(w.student, w.workshopId))?.stepId).toBe(w.stepIds[1]);
		expect(await ws.setLiveStep(w.owner, w.workshopId, null)).toBeNull();
		expect(await ws.getLiveStep(w.viewer, w.workshopId)).toBeNull();
	});
});

describe('students', () => {
	it('a list with bad addresses says which, invites and mails the rest; links work once, for their own address', async () => {
		const w = await makeWorkshopWorld();
		const good = [address('ines.marlow'), address('otto.bram')];
		const report = await ws.inviteToWorkshop(w.instructor, w.workshopId, { addresses: parseAddressText(`${good[0]}\nnot-an-address, ${good[1]}; ${w.student.email}`) }, context());
		expect(report.sent).toEqual(good);
		expect(report.invalid.map((i) => i.entry)).toEqual(['not-an-address']);
		expect(report.skipped.map((s) => s.email)).toEqual([w.student.email]);
		for (const email of good) expect(await mailsTo(email)).toBe(1);

		const token = await joinLink(good[0]);
		expect(await ws.lookUpWorkshopInvitation(token)).toMatchObject({ state: 'open', role: 'student', workshopId: w.workshopId });
		expect((await ruleField(() => ws.acceptWorkshopInvitation(w.stranger, token))).field).toBe('email');
		const [ines] = await db.insert((await import('$lib/server/db/schema')).users).values({ email: good[0], name: 'Ines', emailVerified: new Date() }).returning();
		const inesUser = { id: ines.id, name: 'Ines', email: good[0], isAdmin: false, unitSystem: 'metric' as const };
		expect(await ws.acceptWorkshopInvitation(inesUser, token)).toEqual({ workshopId: w.workshopId, role: 'student' });
		expect((await ruleField(() => ws.acceptWorkshopInvitation(inesUser, token))).status).toBe(410);
		const roster = await ws.workshopRoster(w.owner, w.workshopId);
		expect(roster.people.filter((p) => p.role === 'student').map((p) => p.email).sort()).toEqual([good[0], w.student.email].sort());
		expect(roster.invitations.map((i) => i.email)).toEqual([good[1]]);
	});

	it('a list with no good address is refused naming the field and inserts nothing', async () => {
		const w = await makeWorkshopWorld();
		const e = await ruleField(() => ws.inviteToWorkshop(w.owner, w.workshopId, { addresses: parseAddressText('nobody, mara@') }, context()));
		expect(e.field).toBe('emails');
		expect(e.message).toContain('“nobody”');
		const [{ n }] = await db.select({ n: count() }).from(workshopInvitations).where(eq(workshopInvitations.workshopId, w.workshopId));
		expect(n).toBe(0);
	});

	it('seats are never oversold: an invitation or request accepted into a full workshop is refused and takes nothing', async () => {
		const w = await makeWorkshopWorld({ capacity: 1 });
		await ws.updateWorkshop(w.owner, w.workshopId, details({ capacity: 1, state: 'published' }));
		const [row] = await db.select().from(workshops).where(eq(workshops.id, w.workshopId));
		const email = address('vera.stone');
		await ws.inviteToWorkshop(w.owner, w.workshopId, { addresses: parseAddressText(email) }, context());
		const token = await joinLink(email);
		const [vera] = await db.insert((await import('$lib/server/db/schema')).users).values({ email, name: 'Vera', emailVerified: new Date() }).returning();
		const veraUser = { id: vera.id, name: 'Vera', email, isAdmin: false, unitSystem: 'metric' as const };
		expect((await ruleField(() => ws.acceptWorkshopInvitation(veraUser, token))).status).toBe(409);
		expect(await ws.lookUpWorkshopInvitation(token)).toMatchObject({ state: 'open' });

		// A full workshop takes no requests; once a seat is free, one may ask.
		expect((await ruleField(() => ws.askToJoin(w.stranger, row.slug, 'I photograph fossils'))).message).toBe('The workshop is full.');
		const studentRow = (await ws.workshopRoster(w.owner, w.workshopId)).people.find((p) => p.role === 'student')!;
		await ws.removeFromWorkshop(w.instructor, w.workshopId, studentRow.id);
		const req = await ws.askToJoin(w.stranger, row.slug, 'I photograph fossils');
		expect((await ws.publicWorkshop(w.stranger, row.slug)).viewer).toBe('requested');
		expect((await ruleField(() => ws.askToJoin(w.stranger, row.slug, 'again'))).field).toBe('form');
		// The seat goes to someone else before the answer: accepting is refused and takes nothing.
		await addWorkshopMember(w.workshopId, w.student, 'student');
		expect((await ruleField(() => ws.answerJoinRequest(w.owner, w.workshopId, req.id, 'accepted'))).status).toBe(409);
		await ws.answerJoinRequest(w.owner, w.workshopId, req.id, 'declined');
		expect((await ruleField(() => ws.answerJoinRequest(w.owner, w.workshopId, req.id, 'accepted'))).field).toBe('request');
		await ws.removeFromWorkshop(w.instructor, w.workshopId, (await ws.workshopRoster(w.owner, w.workshopId)).people.find((p) => p.role === 'student')!.id);
		const again = await ws.askToJoin(w.stranger, row.slug, '');
		await ws.answerJoinRequest(w.instructor, w.workshopId, again.id, 'accepted');
		expect((await ws.publicWorkshop(w.stranger, row.slug)).viewer).toBe('member');
		const [{ n }] = await db.select({ n: count() }).from(workshopMembers).where(eq(workshopMembers.workshopId, w.workshopId));
		expect(n).toBe(2); // the instructor and the one student
	});
});

describe('a student copies a step to try it', () => {
	it('into their own studio, as the step shows it, with lineage back to the pinned revision', async () => {
		const w = await makeWorkshopWorld();
		const copy = await ws.copyStepToStudio(w.student, w.stepIds[0], { subject: 'My quartz' });
		expect(copy.derivedFrom).toEqual({ setupId: w.setupId, revisionNumber: 1 });
		const mine = await setupsService.getSetup(w.student, copy.id);
		expect(mine.document.scene.lights.map((l) => l.id)).toEqual(['key']);
		expect(mine.derivedFrom).toMatchObject({ setupId: w.setupId, revisionNumber: 1 });
		expect((mine.derivedFrom as { title?: string | null }).title ?? null).toBeNull();
		const { studioId } = await makeStudio(['owner']);
		expect((await attempt(() => ws.copyStepToStudio(w.student, w.stepIds[0], { subject: 'x', studioId }))).outcome).toBe(404);
	});
});
