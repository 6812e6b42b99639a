// The exercise pages, their form actions, the CSV exports and the hand-in's shot images through the
// running app (TEST_BASE_URL) and its real database, for every role: 404 where the caller may not see,
// 403 where they see but may not act, each refused field named.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, postAction, sampleDocument, type TestUser } from '$lib/server/testing/notebook-fixtures';
import { makeUser, sessionCookie } from '$lib/server/testing/studio-world';
import { addWorkshopMember, makeWorkshopWorld, type WorkshopWorld } from '$lib/server/testing/workshop-world';
import { testImage, SAMPLE_EXIF } from '$lib/server/testing/shot-images';
import { addExercise, handIn, startExercise } from '$lib/server/exercises';
import { uploadShots } from '$lib/server/shots';
import { saveSetup } from '$lib/server/setups';
import { setupSaveSchema } from '$lib/scene/inputs';
import { exerciseCreateSchema, handInSchema } from '$lib/exercises/inputs';
import type { SessionUser } from '$lib/server/session';
import { client } from '$lib/server/db';

let w: WorkshopWorld;
let exerciseId: string;
let handInId: string;
let shotId: string;
let strayShotId: string;
const who: Record<string, TestUser> = {};

const as = async (user: SessionUser): Promise<TestUser> => ({ user, personalStudioId: '', cookie: await sessionCookie(user), token: '' });
const get = (path: string, user?: TestUser) => fetch(`${baseUrl()}${path}`, { redirect: 'manual', headers: user ? { cookie: user.cookie } : {} });

beforeAll(async () => {
	w = await makeWorkshopWorld();
	const otherStudent = await makeUser('ines.marlow');
	await addWorkshopMember(w.workshopId, otherStudent, 'student');
	const exercise = await addExercise(
		w.owner,
		w.workshopId,
		w.lessonId,
		exerciseCreateSchema.parse({ title: 'Quartz at 3:1', setupId: w.setupId, dueAt: new Date(Date.now() + 86_400_000).toISOString(), targets: [{ kind: 'aperture', min: 11, max: 22 }] })
	);
	exerciseId = exercise.id;
	const { setupId } = await startExercise(w.student, exerciseId);
	await saveSetup(w.student, setupId, setupSaveSchema.parse({ baseRevision: 1, document: sampleDocument({ power: 0.5 }), message: 'More power' }));
	const bytes = await testImage({ exif: SAMPLE_EXIF });
	const file = (name: string) => ({ name, type: 'image/jpeg', size: bytes.byteLength, bytes: async () => bytes });
	const up = await uploadShots(w.student, setupId, [file('frame.jpg'), file('unsent.jpg')]);
	shotId = up.created[0].id;
	strayShotId = up.created[1].id;
	handInId = (await handIn(w.student, exerciseId, handInSchema.parse({ setupId, shotIds: [shotId], note: 'Done.' }))).id;
	for (const [name, user] of Object.entries({ owner: w.owner, viewer: w.viewer, instructor: w.instructor, student: w.student, otherStudent, stranger: w.stranger })) who[name] = await as(user);
});

afterAll(async () => {
	await client.end({ timeout: 5 });
});

const page = () => `/workshops/${w.workshopId}/exercises/${exerciseId}`;

describe('reading', () => {
	it('the exercise page: sign in first, 404 to strangers and other workshops’ students, open to those who follow', async () => {
		expect((await get(page())).status).toBe(303);
		expect((await get(page(), who.stranger)).status).toBe(404);
		for (const name of ['owner', 'viewer', 'instructor', 'student', 'otherStudent']) expect((await get(page(), who[name])).status, name).toBe(200);
	});

	it('the hand-in page and its shot images: the student and reviewers; 404 to another student, a stranger and a shot not handed in', async () => {
		const path = `${page()}/hand-ins/${handInId}`;
		for (const name of ['student', 'owner', 'instructor']) {
			expect((await get(path, who[name])).status, name).toBe(200);
			const image = await get(`${path}/shots/${shotId}/thumbnail`, who[name]);
			expect(image.status, name).toBe(200);
			expect(image.headers.get('content-type')).toBe('image/jpeg');
		}
		for (const name of ['otherStudent', 'stranger', 'viewer']) {
			expect((await get(path, who[name])).status, name).toBe(404);
			expect((await get(`${path}/shots/${shotId}/thumbnail`, who[name])).status, name).toBe(404);
		}
		expect((await get(`${path}/shots/${strayShotId}/thumbnail`, who.student)).status).toBe(404);
		expect((await get(`${path}/shots/${shotId}/poster`, who.student)).status).toBe(404);
	});

	it('the CSV exports and the gradebook: reviewers only', async () => {
		for (const path of [`${page()}/table.csv`, `/workshops/${w.workshopId}/gradebook/gradebook.csv`]) {
			for (const name of ['owner', 'instructor']) {
				const res = await get(path, who[name]);
				expect(res.status, `${name} ${path}`).toBe(200);
				expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
				expect(res.headers.get('content-disposition')).toMatch(/attachment; filename=".+\.csv"/);
				expect(await res.text()).toContain(w.student.email);
			}
			for (const name of ['student', 'viewer']) expect((await get(path, who[name])).status, `${name} ${path}`).toBe(403);
			expect((await get(path, who.stranger)).status).toBe(404);
			expect((await get(path)).status).toBe(401);
		}
		expect((await get(`/workshops/${w.workshopId}/gradebook`, who.owner)).status).toBe(200);
		expect((await get(`/workshops/${w.workshopId}/gradebook`, who.student)).status).toBe(403);
	});
});

describe('form actions', () => {
	it('setting an exercise: an inverted range and a missing title are named by their fields; a student is refused', async () => {
		const path = `/workshops/${w.workshopId}/lessons/${w.lessonId}/exercises/new`;
		const form = { title: '', setupId: w.setupId, dueAt: '2030-01-01T10:00', tzOffset: '0', 'target-lightingRatio': 'on', 'target-lightingRatio-min': '4', 'target-lightingRatio-max': '2.5' };
		const bad = await postAction(path, form, who.owner);
		expect(bad.status).toBe(400);
		expect(Object.keys(bad.data.errors).sort()).toEqual(['target-lightingRatio-max', 'title']);
		expect(bad.data.errors['target-lightingRatio-max']).toMatch(/inverted/);
		expect(bad.data.values.title).toBe('');
		const empty = await postAction(path, { ...form, title: 'Ok', 'target-lightingRatio-min': '', 'target-lightingRatio-max': '' }, who.owner);
		expect(empty.data.errors['target-lightingRatio-min']).toMatch(/empty/);
		const made = await postAction(path, { ...form, title: 'Raking light', 'target-lightingRatio-min': '2.5', 'target-lightingRatio-max': '4' }, who.owner);
		expect(made.type).toBe('redirect');
		expect(made.location).toMatch(new RegExp(`^/workshops/${w.workshopId}/exercises/[0-9a-f-]{36}\\?set$`));
		expect((await postAction(path, { ...form, title: 'x', 'target-lightingRatio-min': '2.5', 'target-lightingRatio-max': '4' }, who.student)).status).toBe(403);
	});

	it('start and hand in: students only; a bad setup is named; review: reviewers only, a bad state named', async () => {
		expect((await postAction(`${page()}?/start`, {}, who.instructor)).status).toBe(403);
		expect((await postAction(`${page()}?/start`, {}, who.stranger)).status).toBe(404);
		const started = await postAction(`${page()}?/start`, {}, who.student);
		expect(started.type).toBe('redirect');
		expect(started.location).toMatch(/^\/setups\/[0-9a-f-]{36}#plan$/);
		const notMine = await postAction(`${page()}?/handIn`, { setupId: w.setupId }, who.student);
		expect(notMine.status).toBe(400);
		expect(notMine.data.errors.setupId).toBe('No setup of yours has this id.');
		const garbled = await postAction(`${page()}?/handIn`, { setupId: 'nope' }, who.student);
		expect(garbled.data.errors.setupId).toBe('Choose the setup you hand in.');
		const review = `${page()}/hand-ins/${handInId}?/review`;
		expect((await postAction(review, { state: 'accepted', feedback: '' }, who.student)).status).toBe(403);
		expect((await postAction(review, { state: 'accepted', feedback: '' }, who.otherStudent)).status).toBe(404);
		const badState = await postAction(review, { state: 'maybe', feedback: '' }, who.instructor);
		expect(badState.status).toBe(400);
		expect(badState.data.errors.state).toBe('Choose accepted or another try.');
		const ok = await postAction(review, { state: 'accepted', feedback: 'Good.' }, who.instructor);
		expect(ok.type).toBe('success');
		expect(ok.data).toMatchObject({ saved: true, mailed: true });
	});
});
