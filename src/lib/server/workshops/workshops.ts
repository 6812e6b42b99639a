// Workshop rules: who may do what is asked of authz (authorizeWorkshop); what must stay true (a
// capacity never below the students enrolled, a published workshop keeps a session, a public page
// only while published) is kept here. Inputs arrive parsed by the schemas in $lib/workshops/inputs.
import { error } from '@sveltejs/kit';
import { randomBytes } from 'node:crypto';
import { authorizeStudio, authorizeWorkshop, requireUser, workshopStudioFilter, type WorkshopAccess } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import { renderNotes } from '$lib/notebook/markdown';
import {
	countSeatsTaken,
	deleteSessionRow,
	deleteWorkshopRow,
	findPublishedWorkshopBySlug,
	insertSession,
	insertWorkshop,
	listLessons,
	listSessions,
	listWorkshopsFor,
	slugTaken,
	updateWorkshopDetails
} from '$lib/server/db/queries/workshops';
import { openJoinRequestOf, touchMember } from '$lib/server/db/queries/workshop-people';
import { isUuid } from '$lib/uuid';
import type { SessionInput, WorkshopCreateInput, WorkshopDetailsInput } from '$lib/workshops/inputs';
import type { WorkshopState } from '$lib/workshops/states';

/** A readable, unique address for the public page: the title's words and a short random tail. */
export async function freeSlug(title: string): Promise<string> {
	const words = title
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 60)
		.replace(/-+$/, '');
	for (;;) {
		const slug = `${words || 'workshop'}-${randomBytes(3).toString('hex')}`;
		if (!(await slugTaken(slug))) return slug;
	}
}

export interface WorkshopListItem {
	id: string;
	title: string;
	state: WorkshopState;
	slug: string;
	studioName: string;
	/** How the caller reaches it: running it (studio owner or editor, or instructor) or following it. */
	relation: 'runs' | 'follows';
	firstSession: string | null;
}

/** The workshops the caller runs or follows. */
export async function listMyWorkshops(user: SessionUser | null): Promise<WorkshopListItem[]> {
	const signedIn = requireUser(user);
	const rows = await listWorkshopsFor(signedIn.id, workshopStudioFilter(signedIn));
	// A row without a workshop role of the caller's own came through the studio filter, which lets only
	// those who run the studio's workshops (owners, editors) through.
	return rows.map((r) => ({
			id: r.id,
			title: r.title,
			state: r.state,
			slug: r.slug,
			studioName: r.studioName,
			relation: r.role === 'student' ? 'follows' : 'runs',
			firstSession: r.firstSession ? r.firstSession.toISOString() : null
		}));
}

/** A new draft workshop in a studio where the caller may run workshops (owner or editor). */
export async function createWorkshop(user: SessionUser | null, input: WorkshopCreateInput) {
	const signedIn = requireUser(user);
	const access = await authorizeStudio(signedIn, input.studioId, 'setups.edit');
	return insertWorkshop({
		studioId: access.studioId,
		slug: await freeSlug(input.title),
		title: input.title,
		summary: input.summary,
		capacity: input.capacity,
		state: 'draft',
		createdById: signedIn.id
	});
}

export interface SessionView {
	id: string;
	startsAt: string;
	endsAt: string;
	place: string;
}

export interface WorkshopOverview {
	access: WorkshopAccess & { can: Awaited<ReturnType<typeof authorizeWorkshop>>['can'] };
	workshop: {
		id: string;
		title: string;
		summary: string;
		summaryHtml: string;
		capacity: number;
		state: WorkshopState;
		slug: string;
		studioId: string;
		studioName: string;
		/** A seat's price in minor units (0: free) and its currency. */
		priceMinor: number;
		currency: string;
	};
	sessions: SessionView[];
	lessons: { id: string; position: number; title: string; stepCount: number }[];
	enrolled: number;
	/** Seats held for buyers at checkout. */
	held: number;
	seatsLeft: number;
	live: LivePosition | null;
}

export interface LivePosition {
	lessonId: string | null;
	stepId: string | null;
	updatedAt: string;
}

export function sessionView(s: { id: string; startsAt: Date; endsAt: Date; place: string }): SessionView {
	return { id: s.id, startsAt: s.startsAt.toISOString(), endsAt: s.endsAt.toISOString(), place: s.place };
}

/** The workshop page: details, sessions, lessons, seats; notes that a member opened it. */
export async function workshopOverview(user: SessionUser | null, workshopId: string): Promise<WorkshopOverview> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.follow');
	const w = access.workshop;
	const [sessions, lessons, seats] = await Promise.all([listSessions(w.id), listLessons(w.id), countSeatsTaken(w.id)]);
	if (access.workshopMemberId) await touchMember(access.workshopMemberId);
	return {
		access,
		workshop: {
			id: w.id,
			title: w.title,
			summary: w.summary,
			summaryHtml: renderNotes(w.summary),
			capacity: w.capacity,
			state: w.state,
			slug: w.slug,
			studioId: w.studioId,
			studioName: access.studioName,
			priceMinor: w.priceMinor,
			currency: w.currency
		},
		sessions: sessions.map(sessionView),
		lessons,
		enrolled: seats.students,
		held: seats.held,
		seatsLeft: Math.max(0, w.capacity - seats.taken),
		live: w.liveUpdatedAt ? { lessonId: w.liveLessonId, stepId: w.liveStepId, updatedAt: w.liveUpdatedAt.toISOString() } : null
	};
}

/** Title, summary, capacity and state in one write; a capacity below the students enrolled is refused. */
export async function updateWorkshop(user: SessionUser | null, workshopId: string, input: WorkshopDetailsInput) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	const outcome = await updateWorkshopDetails(access.workshop.id, input);
	if (outcome.outcome === 'below-enrolled') {
		const taken = outcome.enrolled + outcome.held;
		const held = outcome.held ? ` and ${outcome.held} ${outcome.held === 1 ? 'seat is' : 'seats are'} held for buyers at checkout` : '';
		throw new RuleViolation(
			`${outcome.enrolled} ${outcome.enrolled === 1 ? 'student is' : 'students are'} already enrolled${held}: the capacity cannot be below ${taken}. Remove students from the roster first.`,
			'capacity'
		);
	}
	if (outcome.outcome === 'no-sessions') {
		throw new RuleViolation('Add at least one dated session before publishing: the public page shows when and where.', 'state');
	}
}

export async function addSession(user: SessionUser | null, workshopId: string, input: SessionInput) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	return sessionView(await insertSession(access.workshop.id, input));
}

export async function removeSession(user: SessionUser | null, workshopId: string, sessionId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	const outcome = isUuid(sessionId) ? await deleteSessionRow(access.workshop.id, sessionId) : 'missing';
	if (outcome === 'missing') throw new RuleViolation('That session is not part of this workshop.', 'session');
	if (outcome === 'last-published') {
		throw new RuleViolation('A published workshop keeps at least one session: add the new date first, or unpublish it.', 'session');
	}
}

/** Deletes the workshop with its lessons, steps, roster and invitations (the setups stay). */
export async function deleteWorkshop(user: SessionUser | null, workshopId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.manage');
	await deleteWorkshopRow(access.workshop.id);
}

export interface PublicWorkshop {
	id: string;
	slug: string;
	title: string;
	summaryHtml: string;
	studioName: string;
	sessions: SessionView[];
	capacity: number;
	seatsLeft: number;
	/** A seat's price in minor units (0: free, joined by asking) and its currency. */
	priceMinor: number;
	currency: string;
	/** The signed-in visitor's standing, to offer the right button. */
	viewer: 'anonymous' | 'member' | 'requested' | 'none';
}

/** The public page of a published workshop, readable by anyone; anything else is a 404. */
export async function publicWorkshop(user: SessionUser | null, slug: string): Promise<PublicWorkshop> {
	const row = slug.length <= 100 ? await findPublishedWorkshopBySlug(slug) : null;
	if (!row) error(404, 'No such workshop.');
	const w = row.workshop;
	const [sessions, seats] = await Promise.all([listSessions(w.id), countSeatsTaken(w.id)]);
	let viewer: PublicWorkshop['viewer'] = 'anonymous';
	if (user) {
		const member = await authorizeWorkshop(user, w.id, 'workshop.follow').then(
			() => true,
			() => false
		);
		viewer = member ? 'member' : (await openJoinRequestOf(w.id, user.id)) ? 'requested' : 'none';
	}
	return {
		id: w.id,
		slug: w.slug,
		title: w.title,
		summaryHtml: renderNotes(w.summary),
		studioName: row.studioName,
		sessions: sessions.map(sessionView),
		capacity: w.capacity,
		seatsLeft: Math.max(0, w.capacity - seats.taken),
		priceMinor: w.priceMinor,
		currency: w.currency,
		viewer
	};
}
