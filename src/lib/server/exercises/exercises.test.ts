// Exercises and hand-ins on the real database and the mail fake: who may set, start, hand in, read and
// review (every role), the copy's lineage, targets worked out from the stored revision, versions and
// lateness, refusals that name the field and save nothing, twenty hand-ins at once, the CSV.
import { afterAll, describe, expect, it } from 'vitest';
import { and, count, eq } from 'drizzle-orm';

if (!process.env.DATABASE_URL || !process.env.DEV_MAIL_URL || !process.env.TEST_BASE_URL) {
	throw new Error('DATABASE_URL, DEV_MAIL_URL and TEST_BASE_URL are not set: run these tests through `npm test`.');
}

const { client, db } = await import('$lib/server/db');
const { exercises, handIns, setups, workshops } = await import('$lib/server/db/schema');
const ex = await import('$lib/server/exercises');
const { attempt } = await import('$lib/server/testing/authz-world');
const { addWorkshopMember, everyCaller, makeWorkshopWorld } = await import('$lib/server/testing/workshop-world');
const { context, makeUser, mailsTo } = await import('$lib/server/testing/studio-world');
const { sampleDocument } = await import('$lib/server/testing/notebook-fixtures');
const { testImage, SAMPLE_EXIF } = await import('$lib/server/testing/shot-images');
const { createSetup, getSetup, saveSetup } = await import('$lib/server/setups');
const { uploadShots } = await import('$lib/server/shots');
const { setupCreateSchema, setupSaveSchema } = await import('$lib/scene/inputs');
const { exerciseCreateSchema, exerciseUpdateSchema, handInSchema, reviewSchema } = await import('$lib/exercises/inputs');
const { evaluateTargets } = await import('$lib/light/targets');
const { exposureSceneSchema } = await import('$lib/light/schema');

afterAll(async () => {
	await client.end({ timeout: 5 });
});

const TARGETS = [
	{ kind: 'aperture', min: 11, max: 22 },
	{ kind: 'lightCount', max: 1 }
];
const inAWeek = () => new Date(Date.now() + 7 * 24 * 3600_000).toISOString();

async function world() {
	const w = await makeWorkshopWorld();
	// An instructor added by the studio sees none of its setups: the owner sets the exercise.
	const exercise = await ex.addExercise(
		w.owner,
		w.workshopId,
		w.lessonId,
		exerciseCreateSchema.parse({ title: 'Quartz at 3:1', brief: 'Light it **raking**.', setupId: w.setupId, revisionNumber: 1, dueAt: inAWeek(), targets: TARGETS })
	);
	const otherStudent = await makeUser('ines.marlow');
	await addWorkshopMember(w.workshopId, otherStudent, 'student');
	return { ...w, exercise, otherStudent };
}

async function ruleField(work: () => Promise<unknown>) {
	const got = await attempt(work);
	expect(got.outcome, String(got.error)).toBe('rule');
	return got.error as { field: string; message: string };
}

const handInOf = (setupId: string, extra: Record<string, unknown> = {}) => handInSchema.parse({ setupId, ...extra });
const handInCount = async (exerciseId: string) => (await db.select({ n: count() }).from(handIns).where(eq(handIns.exerciseId, exerciseId)))[0].n;

describe('who may do what', () => {
	it('setting, starting, handing in and the table answer each role as the workshop does', async () => {
		const w = await world();
		const { other, callers } = await everyCaller(w);
		const expected: Record<string, { set: unknown; start: unknown; table: unknown; page: unknown }> = {
			stranger: { set: 404, start: 404, table: 404, page: 404 },
			otherStudent: { set: 404, start: 404, table: 404, page: 404 },
			viewer: { set: 403, start: 403, table: 403, page: 'ok' },
			editor: { set: 'ok', start: 403, table: 'ok', page: 'ok' },
			owner: { set: 'ok', start: 403, table: 'ok', page: 'ok' },
			admin: { set: 'ok', start: 'ok', table: 'ok', page: 'ok' },
			instructor: { set: 'rule', start: 403, table: 'ok', page: 'ok' },
			student: { set: 403, start: 'ok', table: 403, page: 'ok' }
		};
		const input = exerciseCreateSchema.parse({ title: 'Another', setupId: w.setupId, dueAt: inAWeek() });
		for (const [name, who] of Object.entries(callers)) {
			// The instructor may set exercises but sees no setup of the studio: a rule on setupId, not a refusal.
			expect((await attempt(() => ex.addExercise(who, w.workshopId, w.lessonId, input))).outcome, `${name} set`).toBe(expected[name].set);
			expect((await attempt(() => ex.startExercise(who, w.exercise.id))).outcome, `${name} start`).toBe(expected[name].start);
			expect((await attempt(() => ex.exerciseTable(who, w.workshopId, w.exercise.id))).outcome, `${name} table`).toBe(expected[name].table);
			expect((await attempt(() => ex.exercisePage(who, w.workshopId, w.exercise.id))).outcome, `${name} page`).toBe(expected[name].page);
		}
		expect((await attempt(() => ex.startExercise(null, w.exercise.id))).outcome).toBe(401);
		// An exercise named under another workshop's address is not there.
		expect((await attempt(() => ex.exercisePage(w.owner, other.workshopId, w.exercise.id))).outcome).toBe(404);
	});

	it('a student sees only their own hand-ins: another student, a stranger and a wrong address get 404', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		const h = await ex.handIn(w.student, w.exercise.id, handInOf(setupId));
		expect((await attempt(() => ex.handInPage(w.student, w.workshopId, w.exercise.id, h.id))).outcome).toBe('ok');
		expect((await attempt(() => ex.handInPage(w.instructor, w.workshopId, w.exercise.id, h.id))).outcome).toBe('ok');
		expect((await attempt(() => ex.handInPage(w.owner, w.workshopId, w.exercise.id, h.id))).outcome).toBe('ok');
		for (const who of [w.otherStudent, w.stranger, w.viewer]) {
			expect((await attempt(() => ex.handInPage(who, w.workshopId, w.exercise.id, h.id))).outcome).toBe(404);
		}
		const other = await makeWorkshopWorld();
		expect((await attempt(() => ex.handInPage(w.owner, other.workshopId, w.exercise.id, h.id))).outcome).toBe(404);
		expect((await attempt(() => ex.handInPage(w.owner, w.workshopId, other.workshopId, h.id))).outcome).toBe(404);
		// The students' own lists hold only their own.
		const mine = await ex.exercisePage(w.otherStudent, w.workshopId, w.exercise.id);
		expect(mine.versions).toEqual([]);
		expect(mine.rows).toBeNull();
	});
});

describe('starting', () => {
	it('copies the starting revision into the student’s personal studio with lineage, once', async () => {
		const w = await world();
		const first = await ex.startExercise(w.student, w.exercise.id);
		expect(first.created).toBe(true);
		const copy = await getSetup(w.student, first.setupId);
		expect(copy.derivedFrom).toMatchObject({ setupId: w.setupId, revisionNumber: 1 });
		expect(copy.canEdit).toBe(true);
		const again = await ex.startExercise(w.student, w.exercise.id);
		expect(again).toEqual({ setupId: first.setupId, created: false });
		// The editor's brief panel finds the exercise for the student's copy, and for nobody else.
		expect((await ex.exerciseForSetup(w.student, first.setupId))?.id).toBe(w.exercise.id);
		expect(await ex.exerciseForSetup(w.owner, first.setupId)).toBeNull();
	});

	it('two starts at the same moment keep one copy', async () => {
		const w = await world();
		const [a, b] = await Promise.all([ex.startExercise(w.student, w.exercise.id), ex.startExercise(w.student, w.exercise.id)]);
		expect(a.setupId).toBe(b.setupId);
	});
});

describe('handing in', () => {
	it('targets are worked out on the server from the stored revision, and stored with the hand-in', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		const doc = sampleDocument();
		doc.scene.camera.aperture = 5.6;
		await saveSetup(w.student, setupId, setupSaveSchema.parse({ baseRevision: 1, document: doc, message: 'Opened up' }));
		const atOne = await ex.handIn(w.student, w.exercise.id, handInOf(setupId, { revisionNumber: 1 }));
		const atTwo = await ex.handIn(w.student, w.exercise.id, handInOf(setupId));
		expect(atOne).toMatchObject({ version: 1, revisionNumber: 1, late: false, targetsMet: 2 });
		expect(atTwo).toMatchObject({ version: 2, revisionNumber: 2, targetsMet: 1 });
		expect(atTwo.targetResults).toEqual(evaluateTargets(w.exercise.targets, exposureSceneSchema.parse(doc.scene)));
		expect(atTwo.targetResults.find((r) => r.kind === 'aperture')).toMatchObject({ met: false, value: 5.6 });
		// An exercise changed later leaves the hand-ins as they were checked.
		await ex.updateExercise(w.owner, w.exercise.id, exerciseUpdateSchema.parse({ title: 'Changed', brief: '', dueAt: inAWeek(), targets: [] }));
		const page = await ex.handInPage(w.student, w.workshopId, w.exercise.id, atTwo.id);
		expect(page.handIn.targetResults).toHaveLength(2);
		expect(page.sentences.join(' ')).toMatch(/f\/5\.6/);
	});

	it('after the due date a hand-in is marked late', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		await db.update(exercises).set({ dueAt: new Date(Date.now() - 3600_000) }).where(eq(exercises.id, w.exercise.id));
		expect(await ex.handIn(w.student, w.exercise.id, handInOf(setupId))).toMatchObject({ late: true, version: 1 });
		const table = await ex.exerciseTable(w.owner, w.workshopId, w.exercise.id);
		expect(table.rows.find((r) => r.userId === w.student.id)).toMatchObject({ late: true, version: 1, targetsMet: 2, targetsTotal: 2, state: 'handed-in' });
		expect(table.rows.find((r) => r.userId === w.otherStudent.id)).toMatchObject({ handInId: null, state: null });
	});

	it('bad hand-ins name their field and store nothing', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		const foreignSetup = (await ex.startExercise(w.otherStudent, w.exercise.id)).setupId;
		const ownOther = await createSetup(w.student, setupCreateSchema.parse({ title: 'Not from the exercise', subject: 'quartz', document: sampleDocument() }));
		expect((await ruleField(() => ex.handIn(w.student, w.exercise.id, handInOf(foreignSetup)))).field).toBe('setupId');
		const notStarted = await ruleField(() => ex.handIn(w.student, w.exercise.id, handInOf(ownOther.id)));
		expect(notStarted).toMatchObject({ field: 'setupId', message: expect.stringMatching(/not started from this exercise/) });
		expect((await ruleField(() => ex.handIn(w.student, w.exercise.id, handInOf(setupId, { revisionNumber: 9 })))).field).toBe('revisionNumber');
		// A shot of another setup.
		const bytes = await testImage({ exif: SAMPLE_EXIF });
		const up = await uploadShots(w.student, ownOther.id, [{ name: 'stray.jpg', type: 'image/jpeg', size: bytes.byteLength, bytes: async () => bytes }]);
		expect((await ruleField(() => ex.handIn(w.student, w.exercise.id, handInOf(setupId, { shotIds: [up.created[0].id] })))).field).toBe('shotIds');
		await db.update(workshops).set({ state: 'archived' }).where(eq(workshops.id, w.workshopId));
		expect((await ruleField(() => ex.handIn(w.student, w.exercise.id, handInOf(setupId)))).field).toBe('exerciseId');
		expect(await handInCount(w.exercise.id)).toBe(0);
		// Those who do not hand in are refused before anything is looked at.
		expect((await attempt(() => ex.handIn(w.instructor, w.exercise.id, handInOf(setupId)))).outcome).toBe(403);
		expect((await attempt(() => ex.handIn(w.stranger, w.exercise.id, handInOf(setupId)))).outcome).toBe(404);
	});

	it('an exercise due in the past, or with a setup the instructor cannot see, is refused naming the field', async () => {
		const w = await world();
		const past = exerciseCreateSchema.parse({ title: 'Late', setupId: w.setupId, dueAt: '2020-01-01T00:00:00Z' });
		expect((await ruleField(() => ex.addExercise(w.owner, w.workshopId, w.lessonId, past))).field).toBe('dueAt');
		const hidden = await createSetup(w.stranger, setupCreateSchema.parse({ title: 'Private', subject: 'quartz', document: sampleDocument() }));
		const unseen = exerciseCreateSchema.parse({ title: 'Unseen', setupId: hidden.id, dueAt: inAWeek() });
		expect((await ruleField(() => ex.addExercise(w.owner, w.workshopId, w.lessonId, unseen))).field).toBe('setupId');
		const missing = exerciseCreateSchema.parse({ title: 'Missing', setupId: w.setupId, revisionNumber: 40, dueAt: inAWeek() });
		expect((await ruleField(() => ex.addExercise(w.owner, w.workshopId, w.lessonId, missing))).field).toBe('revisionNumber');
	});

	it('twenty students handing in at the same moment are each stored once; one student’s five at once get versions 1 to 5', async () => {
		const w = await world();
		const students = await Promise.all(Array.from({ length: 20 }, (_, i) => makeUser(`student.${i}`)));
		for (const s of students) await addWorkshopMember(w.workshopId, s, 'student');
		const copies = await Promise.all(students.map((s) => ex.startExercise(s, w.exercise.id)));
		await Promise.all(students.map((s, i) => ex.handIn(s, w.exercise.id, handInOf(copies[i].setupId))));
		const rows = await db.select().from(handIns).where(eq(handIns.exerciseId, w.exercise.id));
		expect(rows).toHaveLength(20);
		expect(new Set(rows.map((r) => r.userId)).size).toBe(20);
		expect(rows.every((r) => r.version === 1)).toBe(true);
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		await Promise.all(Array.from({ length: 5 }, () => ex.handIn(w.student, w.exercise.id, handInOf(setupId))));
		const mine = await db.select({ version: handIns.version }).from(handIns).where(and(eq(handIns.exerciseId, w.exercise.id), eq(handIns.userId, w.student.id)));
		expect(mine.map((r) => r.version).sort()).toEqual([1, 2, 3, 4, 5]);
	});
});

describe('review', () => {
	it('an instructor’s feedback and state reach the student by e-mail and on the page', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		const h = await ex.handIn(w.student, w.exercise.id, handInOf(setupId, { note: 'Moved the card in.' }));
		const before = await mailsTo(w.student.email);
		const { mailed } = await ex.reviewHandIn(w.instructor, w.workshopId, w.exercise.id, h.id, reviewSchema.parse({ state: 'another-try', feedback: 'Bring the card **closer**.' }), context());
		expect(mailed).toBe(true);
		expect(await mailsTo(w.student.email)).toBe(before + 1);
		const page = await ex.handInPage(w.student, w.workshopId, w.exercise.id, h.id);
		expect(page.handIn).toMatchObject({ state: 'another-try', feedback: 'Bring the card **closer**.' });
		expect(page.handIn.feedbackHtml).toContain('<strong>closer</strong>');
	});

	it('the student, another student, a stranger and another workshop’s address cannot review; nothing changes', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		const h = await ex.handIn(w.student, w.exercise.id, handInOf(setupId));
		const input = reviewSchema.parse({ state: 'accepted', feedback: 'Fine.' });
		expect((await attempt(() => ex.reviewHandIn(w.student, w.workshopId, w.exercise.id, h.id, input, context()))).outcome).toBe(403);
		expect((await attempt(() => ex.reviewHandIn(w.otherStudent, w.workshopId, w.exercise.id, h.id, input, context()))).outcome).toBe(404);
		expect((await attempt(() => ex.reviewHandIn(w.stranger, w.workshopId, w.exercise.id, h.id, input, context()))).outcome).toBe(404);
		const other = await makeWorkshopWorld();
		expect((await attempt(() => ex.reviewHandIn(other.owner, other.workshopId, w.exercise.id, h.id, input, context()))).outcome).toBe(404);
		const [row] = await db.select().from(handIns).where(eq(handIns.id, h.id));
		expect(row).toMatchObject({ state: 'handed-in', feedback: '', reviewedAt: null });
	});
});

describe('export', () => {
	it('the gradebook has a line a student and exercise, quoted where needed, formulas defused', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		await ex.handIn(w.student, w.exercise.id, handInOf(setupId));
		const book = await ex.gradebook(w.owner, w.workshopId);
		const csv = ex.gradebookCsv(book.exercises);
		const lines = csv.trimEnd().split('\r\n');
		expect(lines[0]).toBe('exercise,due,student,email,handed in,version,late,targets met,targets,state');
		expect(lines).toHaveLength(3);
		expect(lines.find((l) => l.includes(w.student.email))).toMatch(/,1,no,2,2,Waiting for review$/);
		expect(lines.find((l) => l.includes(w.otherStudent.email))).toMatch(/,Not handed in$/);
		expect(ex.csvCell('=SUM(A1)')).toBe("'=SUM(A1)");
		expect(ex.csvCell('a, "b"')).toBe('"a, ""b"""');
		expect((await attempt(() => ex.gradebook(w.student, w.workshopId))).outcome).toBe(403);
	});
});

describe('removal', () => {
	it('removing an exercise leaves the students’ copies in their notebooks', async () => {
		const w = await world();
		const { setupId } = await ex.startExercise(w.student, w.exercise.id);
		await ex.removeExercise(w.owner, w.exercise.id);
		const [copy] = await db.select().from(setups).where(eq(setups.id, setupId));
		expect(copy.deletedAt).toBeNull();
		expect((await attempt(() => ex.exercisePage(w.student, w.workshopId, w.exercise.id))).outcome).toBe(404);
	});
});
