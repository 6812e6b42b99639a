// A workshop world for the workshop tests, on the real database: a studio with an owner, an editor and a
// viewer, a setup with two revisions, a workshop with one lesson of two steps pinning revision 1, an
// instructor and a student added by the studio, and strangers. Random addresses, so no test leans on
// another or on the seed.
import { db } from '$lib/server/db';
import { workshopMembers, type WorkshopRole } from '$lib/server/db/schema';
import { createSetup, saveSetup } from '$lib/server/setups';
import { setupCreateSchema, setupSaveSchema } from '$lib/scene/inputs';
import { sampleDocument } from './notebook-fixtures';
import { makeStudio, makeUser } from './studio-world';
import { makeUser as makeAdminable } from './authz-world';
import type { SessionUser } from '$lib/server/session';
import { addLesson, addSession, addStep, createWorkshop } from '$lib/server/workshops';
import { lessonSchema, sessionSchema, stepCreateSchema, workshopCreateSchema } from '$lib/workshops/inputs';

export async function addWorkshopMember(workshopId: string, user: SessionUser, role: WorkshopRole) {
	const [row] = await db.insert(workshopMembers).values({ workshopId, userId: user.id, role }).returning();
	return row;
}

export async function makeWorkshopWorld({ capacity = 12 } = {}) {
	const { studioId, people } = await makeStudio(['owner', 'editor', 'viewer']);
	const [owner, editor, viewer] = people.map((p) => p.user);
	const setup = await createSetup(owner, setupCreateSchema.parse({ studioId, title: 'Quartz cluster on velvet', subject: 'Quartz', document: sampleDocument() }));
	await saveSetup(owner, setup.id, setupSaveSchema.parse({ baseRevision: 1, document: sampleDocument({ power: 0.5 }), message: 'Half power' }));
	const workshop = await createWorkshop(owner, workshopCreateSchema.parse({ studioId, title: 'Small Light, Big Detail', capacity }));
	await addSession(owner, workshop.id, sessionSchema.parse({ startsAt: '2027-01-14T18:30:00Z', endsAt: '2027-01-14T21:00:00Z', place: 'Community hall' }));
	const lesson = await addLesson(owner, workshop.id, lessonSchema.parse({ title: 'One flash, one card', studentNotes: 'For students', presenterNotes: 'For the presenter only' }));
	const alone = await addStep(owner, workshop.id, lesson.id, stepCreateSchema.parse({ setupId: setup.id, revisionNumber: 1, hiddenElementIds: ['card'], caption: 'The key alone' }));
	const both = await addStep(owner, workshop.id, lesson.id, stepCreateSchema.parse({ setupId: setup.id, revisionNumber: 1, caption: 'Key and card' }));
	const instructor = await makeUser('otto.bram');
	const student = await makeUser('pebble.finch');
	const stranger = await makeUser('vera.stone');
	await addWorkshopMember(workshop.id, instructor, 'instructor');
	await addWorkshopMember(workshop.id, student, 'student');
	return { studioId, owner, editor, viewer, instructor, student, stranger, setupId: setup.id, workshopId: workshop.id, lessonId: lesson.id, stepIds: [alone.id, both.id] };
}
export type WorkshopWorld = Awaited<ReturnType<typeof makeWorkshopWorld>>;

/**
 * Everyone who may knock on a workshop, by name: its studio's owner, editor and viewer, its instructor
 * and student, a stranger, a student of another workshop (`other`) and a site admin.
 */
export async function everyCaller(w: WorkshopWorld) {
	const other = await makeWorkshopWorld();
	const admin = await makeAdminable('operator', true);
	const callers = {
		stranger: w.stranger,
		otherStudent: other.student,
		viewer: w.viewer,
		editor: w.editor,
		owner: w.owner,
		admin,
		instructor: w.instructor,
		student: w.student
	};
	return { other, callers };
}
