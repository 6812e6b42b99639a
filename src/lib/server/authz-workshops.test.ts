// authorizeWorkshop on the real database: every studio role, the two workshop roles (instructor and
// student), a site admin and strangers against each workshop capability; and what a student may read:
// exactly the revisions the lessons pin, through the workshop, and nothing of the studio itself.
import { afterAll, describe, expect, it } from 'vitest';

if (!process.env.DATABASE_URL) {
	throw new Error('DATABASE_URL is not set: these tests run against the real PostgreSQL (run them through `npm test`).');
}

const { client } = await import('$lib/server/db');
const authz = await import('$lib/server/authz');
const { attempt } = await import('$lib/server/testing/authz-world');
const { addWorkshopMember, everyCaller, makeWorkshopWorld } = await import('$lib/server/testing/workshop-world');
const setupsService = await import('$lib/server/setups');
const ws = await import('$lib/server/workshops');
const { setupListQuerySchema, setupSaveSchema, setupDuplicateSchema } = await import('$lib/scene/inputs');
const { sampleDocument } = await import('$lib/server/testing/notebook-fixtures');
type Outcome = import('$lib/server/testing/authz-world').Outcome;
type Capability = import('$lib/server/authz').WorkshopCapability;

afterAll(async () => {
	await client.end({ timeout: 5 });
});

const CALLERS = ['stranger', 'otherStudent', 'viewer', 'editor', 'owner', 'admin', 'instructor', 'student'] as const;
type Caller = (typeof CALLERS)[number];

/** Issue 14's roles: studio owners and editors and added instructors run a workshop; students and studio viewers follow it. */
const EXPECTED: Record<Capability, Record<Caller, Outcome>> = {
	'workshop.follow': { stranger: 404, otherStudent: 404, viewer: 'ok', editor: 'ok', owner: 'ok', admin: 'ok', instructor: 'ok', student: 'ok' },
	'workshop.presenterNotes': { stranger: 404, otherStudent: 404, viewer: 403, editor: 'ok', owner: 'ok', admin: 'ok', instructor: 'ok', student: 403 },
	'workshop.run': { stranger: 404, otherStudent: 404, viewer: 403, editor: 'ok', owner: 'ok', admin: 'ok', instructor: 'ok', student: 403 },
	'workshop.roster': { stranger: 404, otherStudent: 404, viewer: 403, editor: 'ok', owner: 'ok', admin: 'ok', instructor: 'ok', student: 403 },
	'workshop.manage': { stranger: 404, otherStudent: 404, viewer: 403, editor: 'ok', owner: 'ok', admin: 'ok', instructor: 403, student: 403 },
	// Issue 17: those who run a workshop review its hand-ins; only its students hand in.
	'workshop.review': { stranger: 404, otherStudent: 404, viewer: 403, editor: 'ok', owner: 'ok', admin: 'ok', instructor: 'ok', student: 403 },
	'workshop.handIn': { stranger: 404, otherStudent: 404, viewer: 403, editor: 403, owner: 403, admin: 'ok', instructor: 403, student: 'ok' }
};

async function world() {
	const w = await makeWorkshopWorld();
	const { other, callers } = await everyCaller(w);
	return { w, other, callers };
}

describe('authorizeWorkshop: role × capability', () => {
	it('every caller gets exactly what the role allows, 404 where the workshop is out of sight', async () => {
		const { w, callers } = await world();
		for (const caller of CALLERS) {
			for (const capability of authz.WORKSHOP_CAPABILITIES) {
				const got = await attempt(() => authz.authorizeWorkshop(callers[caller], w.workshopId, capability));
				expect(got.outcome, `${caller} ${capability}`).toBe(EXPECTED[capability][caller]);
				if (got.outcome === 'ok') {
					expect(got.result!.workshop.id).toBe(w.workshopId);
					for (const c of authz.WORKSHOP_CAPABILITIES) expect(got.result!.can[c], `${caller} can ${c}`).toBe(EXPECTED[c][caller] === 'ok');
				}
			}
		}
	});

	it('anonymous callers get 401; a malformed or unknown id is the same 404 as a workshop out of sight', async () => {
		const { w } = await world();
		expect((await attempt(() => authz.authorizeWorkshop(null, w.workshopId, 'workshop.follow'))).outcome).toBe(401);
		for (const id of ['not-a-uuid', '00000000-0000-4000-8000-000000000000']) {
			const got = await attempt(() => authz.authorizeWorkshop(w.owner, id, 'workshop.follow'));
			expect(got.outcome).toBe(404);
			expect((got.error as { body: { message: string } }).body.message).toBe(authz.WORKSHOP_NOT_FOUND);
		}
		expect((await attempt(() => ws.stepForViewer(null, w.stepIds[0]))).outcome).toBe(401);
	});

	it('the services answer as authz does: a student follows, cannot edit; the other workshop’s student sees nothing', async () => {
		const { w, callers } = await world();
		expect((await attempt(() => ws.workshopOverview(callers.student, w.workshopId))).outcome).toBe('ok');
		expect((await attempt(() => ws.updateLesson(callers.student, w.workshopId, w.lessonId, { title: 'x', studentNotes: '', presenterNotes: '' }))).outcome).toBe(403);
		expect((await attempt(() => ws.setLiveStep(callers.student, w.workshopId, w.stepIds[0]))).outcome).toBe(403);
		expect((await attempt(() => ws.workshopRoster(callers.student, w.workshopId))).outcome).toBe(403);
		for (const work of [
			() => ws.workshopOverview(callers.otherStudent, w.workshopId),
			() => ws.lessonForViewer(callers.otherStudent, w.workshopId, w.lessonId),
			() => ws.stepForViewer(callers.otherStudent, w.stepIds[0]),
			() => ws.getLiveStep(callers.otherStudent, w.workshopId),
			() => ws.copyStepToStudio(callers.otherStudent, w.stepIds[0], { subject: 'Quartz' })
		] as (() => Promise<unknown>)[]) {
			expect((await attempt(work)).outcome).toBe(404);
		}
		const instructorRow = (await ws.workshopRoster(callers.owner, w.workshopId)).people.find((p) => p.role === 'instructor')!;
		expect((await attempt(() => ws.removeFromWorkshop(callers.instructor, w.workshopId, instructorRow.id))).outcome).toBe(403);
	});
});

describe('a student reads exactly the revisions the lessons pin', () => {
	it('not the setup, its other revisions, later edits, its exposure, or anything else of the studio', async () => {
		const { w } = await world();
		for (const work of [
			() => setupsService.getSetup(w.student, w.setupId),
			() => setupsService.getSetupRevision(w.student, w.setupId, 1),
			() => setupsService.getSetupRevision(w.student, w.setupId, 2),
			() => setupsService.setupExposure(w.student, w.setupId, 1),
			() => setupsService.listSetupRevisions(w.student, w.setupId),
			() => setupsService.duplicateSetup(w.student, w.setupId, setupDuplicateSchema.parse({ subject: 'Quartz' })),
			() => authz.authorizeStudio(w.student, w.studioId, 'studio.view')
		] as (() => Promise<unknown>)[]) {
			expect((await attempt(work)).outcome).toBe(404);
		}
		const list = await setupsService.listSetupsFor(w.student, setupListQuerySchema.parse({}));
		expect(list.items.map((i) => i.id)).not.toContain(w.setupId);

		// Through the workshop: the pinned revision, as the step shows it, and never presenter notes.
		const step = await ws.stepForViewer(w.student, w.stepIds[0]);
		expect(step.revisionNumber).toBe(1);
		expect(step.latestRevision).toBeNull();
		expect(step.visibleElementIds).toEqual(['key']);
		expect(step.document.scene.lights.map((l) => l.id)).toEqual(['key']);
		expect(step.exposure?.lights.map((l) => l.id)).toEqual(['key']);
		const lesson = await ws.lessonForViewer(w.student, w.workshopId, w.lessonId);
		expect(lesson.lesson.presenterNotes).toBeNull();
		expect(lesson.lesson.presenterNotesHtml).toBeNull();
		expect(JSON.stringify(lesson)).not.toContain('For the presenter only');
		expect(lesson.lesson.studentNotes).toBe('For students');
		const forInstructor = await ws.lessonForViewer(w.instructor, w.workshopId, w.lessonId);
		expect(forInstructor.lesson.presenterNotes).toBe('For the presenter only');
		expect(forInstructor.steps[0].latestRevision).toBe(2);

		// A later edit of the setup does not change the taught step.
		const before = step.revisionDocument;
		await setupsService.saveSetup(w.owner, w.setupId, setupSaveSchema.parse({ baseRevision: 2, document: sampleDocument({ power: 1 }), message: 'Full power' }));
		const after = await ws.stepForViewer(w.student, w.stepIds[0]);
		expect(after.revisionNumber).toBe(1);
		expect(after.revisionDocument).toEqual(before);
	});

	it('an instructor added to the workshop runs it but reads no setup of the studio, and cannot pin one', async () => {
		const { w } = await world();
		expect((await attempt(() => setupsService.getSetup(w.instructor, w.setupId))).outcome).toBe(404);
		const refused = await attempt(() => ws.addStep(w.instructor, w.workshopId, w.lessonId, { setupId: w.setupId, hiddenElementIds: [], caption: '' }));
		expect(refused.outcome).toBe('rule');
		expect((refused.error as { field: string }).field).toBe('setupId');
	});

	it('a student of one workshop who is also a student of another sees each through its own workshop only', async () => {
		const { w, other } = await world();
		await addWorkshopMember(other.workshopId, w.student, 'student');
		expect((await attempt(() => ws.stepForViewer(w.student, other.stepIds[1]))).outcome).toBe('ok');
		expect((await attempt(() => setupsService.getSetup(w.student, other.setupId))).outcome).toBe(404);
	});
});
