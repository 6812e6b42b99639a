// The notebook's rules: who may do what is asked of authz; what must stay true (every save is a new
// revision, a stale save never overwrites, gear copies never change, lineage is recorded) is kept here.
// Pages and API routes call these functions; inputs arrive parsed by the schemas in $lib/scene.
// Documents and gear copies live in setups-documents.ts, the JSON answers in setups-responses.ts, a
// stale save's account of what changed in setups-conflict.ts, export and import in setups-export.ts.
import { error } from '@sveltejs/kit';
import {
	authorizeSetup,
	authorizeStudio,
	can,
	requireUser,
	SETUP_NOT_FOUND,
	studioFilter,
	type StudioAccess
} from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import {
	appendRevision,
	findRevision,
	findRevisionDocument,
	insertSetup,
	listDerivatives,
	listRevisions,
	listSetups,
	revisionThumbnail,
	trashSetupRow,
	untrashSetupRow,
	visibleSetupTitle
} from '$lib/server/db/queries/setups';
import type { Setup } from '$lib/server/db/schema';
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { findNonFinite } from '$lib/light/finite';
import { referencedGearIds, type SetupDocument } from '$lib/scene/document';
import type { SetupCreateInput, SetupDuplicateInput, SetupListQuery, SetupSaveInput } from '$lib/scene/inputs';
import {
	InputError,
	readStoredDocument,
	searchTextOf,
	snapshotGear,
	StaleRevisionError,
	type ReadDocument
} from '$lib/server/setups-documents';
import {
	listItem,
	revisionDetail,
	revisionSummary,
	setupDetail,
	type RevisionDetail,
	type RevisionSummary,
	type SetupDetail,
	type SetupListPage
} from '$lib/server/setups-responses';
import { conflictSince } from '$lib/server/setups-conflict';

export { InputError, readStoredDocument, snapshotGear, StaleRevisionError, type ReadDocument };
export type { RevisionDetail, RevisionSummary, SetupDetail, SetupListItem, SetupListPage } from '$lib/server/setups-responses';

export async function personalStudioId(user: SessionUser) {
	const studio = await ensurePersonalStudio(user.id, user.name || user.email.split('@')[0] || 'My');
	return studio.id;
}

/** A stale save's refusal (409), with what the saves since the base changed when that can be told. */
async function staleSave(user: SessionUser, setupId: string, baseRevision: number, latestRevision: number) {
	return new StaleRevisionError(latestRevision, await conflictSince(setupId, baseRevision, user.unitSystem));
}

// ---------- list ----------

/** The notebook: setups of one studio (`query.studio`) or of every studio the caller can view. */
export async function listSetupsFor(user: SessionUser | null, query: SetupListQuery): Promise<SetupListPage> {
	const signedIn = requireUser(user);
	const studioIds = query.studio ? [(await authorizeStudio(signedIn, query.studio, 'setups.view')).studioId] : studioFilter(signedIn, 'setups.view');
	const { items, total } = await listSetups({ ...query, gearId: query.gear, studioIds });
	return { items: items.map((r) => listItem(r)), total, page: query.page, pageSize: query.pageSize };
}

/** The trash: deleted setups of one studio, or of every studio where the caller may edit (and so restore). */
export async function listTrash(user: SessionUser | null, query: SetupListQuery): Promise<SetupListPage> {
	const signedIn = requireUser(user);
	const studioIds = query.studio ? [(await authorizeStudio(signedIn, query.studio, 'setups.edit')).studioId] : studioFilter(signedIn, 'setups.edit');
	const { items, total } = await listSetups({ ...query, gearId: query.gear, studioIds, trashed: true });
	return { items: items.map((r) => listItem(r, true)), total, page: query.page, pageSize: query.pageSize };
}


// ---------- read ----------

/** Lineage as the caller may see it: where the setup came from (its title only if they may see it), what came from it. */
async function lineageOf(user: SessionUser, setup: Setup) {
	const visible = studioFilter(user, 'setups.view');
	const derived = setup.derivedFromSetupId && setup.derivedFromRevision ? { setupId: setup.derivedFromSetupId, revisionNumber: setup.derivedFromRevision } : null;
	const [originTitle, derivatives] = await Promise.all([derived ? visibleSetupTitle(derived.setupId, visible) : null, listDerivatives(setup.id, visible)]);
	const derivedFrom: SetupDetail['derivedFrom'] = derived && originTitle !== null ? { ...derived, title: originTitle } : derived;
	return { derivedFrom, derivatives };
}

/** The latest revision's document, author, time and message (not its thumbnail). */
async function latestRevision(setup: Setup) {
	const latest = await findRevisionDocument(setup.id, setup.latestRevision);
	if (!latest) error(404, SETUP_NOT_FOUND);
	return latest;
}

export async function getSetup(user: SessionUser | null, setupId: string): Promise<SetupDetail> {
	const access = await authorizeSetup(user, setupId, 'setups.view');
	const [latest, { derivedFrom, derivatives }] = await Promise.all([latestRevision(access.setup), lineageOf(user!, access.setup)]);
	return setupDetail(access, readStoredDocument(latest.document), derivedFrom, derivatives);
}

export interface SetupOverview {
	setup: SetupDetail;
	/** Who saved the latest revision, when and why. */
	latest: { authorName: string | null; createdAt: string; message: string };
	exposure: (ExposureResult & { revisionNumber: number }) | null;
	/** Why there is no exposure (the latest document fails today's checks, or gives a non-finite number). */
	exposureError: string | null;
	/** The caller's standing in the setup's studio, as authz answered it (e.g. for its gear shelf). */
	access: StudioAccess;
}

/** What the setup page shows, asked of authz once: the setup, its latest revision and that revision's exposure. */
export async function setupOverview(user: SessionUser | null, setupId: string): Promise<SetupOverview> {
	const access = await authorizeSetup(user, setupId, 'setups.view');
	const [latest, { derivedFrom, derivatives }] = await Promise.all([latestRevision(access.setup), lineageOf(user!, access.setup)]);
	const setup = setupDetail(access, readStoredDocument(latest.document), derivedFrom, derivatives);
	const computed = exposureOf(setup, setup.revisionNumber);
	return {
		setup,
		latest: { authorName: latest.authorName, createdAt: latest.createdAt.toISOString(), message: latest.message },
		exposure: computed.ok ? { ...computed.result, revisionNumber: setup.revisionNumber } : null,
		exposureError: computed.ok ? null : computed.message,
		access: access.access
	};
}

export async function listSetupRevisions(user: SessionUser | null, setupId: string): Promise<RevisionSummary[]> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.view');
	return (await listRevisions(setup.id)).map(revisionSummary);
}

export async function loadRevision(setup: Setup, number: number) {
	const row = await findRevision(setup.id, number);
	if (!row) error(404, `This setup has no revision ${number}.`);
	return row;
}

export async function getSetupRevision(user: SessionUser | null, setupId: string, number: number): Promise<RevisionDetail> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.view');
	return revisionDetail(setup, await loadRevision(setup, number));
}

export async function getRevisionThumbnail(user: SessionUser | null, setupId: string, number: number): Promise<Uint8Array> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.view');
	const png = await revisionThumbnail(setup.id, number);
	if (!png) error(404, `Revision ${number} of this setup has no thumbnail.`);
	return png;
}

/** The exposure of a stored document, or why it has none (422 on the API). */
function exposureOf(read: ReadDocument, revisionNumber: number): { ok: true; result: ExposureResult } | { ok: false; message: string } {
	if (read.documentIssues) {
		const [first] = read.documentIssues;
		return { ok: false, message: `Revision ${revisionNumber} cannot be computed: its document does not pass today's checks (${first.path.join('.')}: ${first.message}).` };
	}
	// A flash calibrated on the shelf before this revision was saved carries its offset in the scene.
	const result = computeExposure(read.document.scene);
	const bad = findNonFinite(result);
	if (bad) return { ok: false, message: `Revision ${revisionNumber} gives a result that is not a finite number (${bad.join('.')}); check its scene.` };
	return { ok: true, result };
}

/** The exposure answer (as POST /api/v1/exposure gives it) for a revision, computed here from the stored scene. */
export async function setupExposure(
	user: SessionUser | null,
	setupId: string,
	number?: number
): Promise<ExposureResult & { revisionNumber: number }> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.view');
	const revisionNumber = number ?? setup.latestRevision;
	const { revision } = await loadRevision(setup, revisionNumber);
	const computed = exposureOf(readStoredDocument(revision.document), revisionNumber);
	if (!computed.ok) error(422, computed.message);
	return { ...computed.result, revisionNumber };
}

// ---------- write ----------

export async function createSetup(user: SessionUser | null, input: SetupCreateInput): Promise<{ id: string; revisionNumber: 1 }> {
	const signedIn = requireUser(user);
	const studioId = input.studioId ?? (await personalStudioId(signedIn));
	await authorizeStudio(signedIn, studioId, 'setups.edit');
	const document = await snapshotGear(studioId, input.document, null);
	const created = await insertSetup({
		studioId,
		title: input.title,
		subject: input.subject,
		tags: input.tags,
		document,
		gearIds: referencedGearIds(document),
		searchText: searchTextOf(input.title, input.subject, input.tags, document),
		message: input.message || 'First revision',
		authorId: signedIn.id,
		thumbnailPng: input.thumbnailPng ?? null
	});
	return { id: created.id, revisionNumber: 1 };
}

/** PUT: a new revision on top of `baseRevision`, or StaleRevisionError (409) when it is not the latest. */
export async function saveSetup(user: SessionUser | null, setupId: string, input: SetupSaveInput): Promise<{ revisionNumber: number }> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.edit');
	if (input.baseRevision !== setup.latestRevision) throw await staleSave(user!, setup.id, input.baseRevision, setup.latestRevision);
	// Revisions never change, so reading the base outside the save's transaction is safe: if it has
	// stopped being the latest meanwhile, the conditional update below refuses the save.
	const base = await findRevision(setup.id, input.baseRevision);
	const baseDoc = base ? readStoredDocument(base.revision.document) : null;
	const document = await snapshotGear(
		setup.studioId,
		input.document,
		baseDoc && !baseDoc.documentIssues ? baseDoc.document : null,
		input.refreshGear
	);
	const title = input.title ?? setup.title;
	const subject = input.subject ?? setup.subject;
	const tags = input.tags ?? setup.tags;
	const outcome = await appendRevision(setup.id, input.baseRevision, {
		document,
		title,
		subject,
		tags,
		gearIds: referencedGearIds(document),
		searchText: searchTextOf(title, subject, tags, document),
		message: input.message ?? '',
		authorId: user!.id,
		thumbnailPng: input.thumbnailPng ?? null
	});
	if (outcome.outcome === 'stale') throw await staleSave(user!, setup.id, input.baseRevision, outcome.latestRevision);
	if (outcome.outcome === 'missing') error(404, SETUP_NOT_FOUND);
	return { revisionNumber: outcome.revisionNumber };
}

/** A new revision that copies revision `number` (document and thumbnail); the catalogue fields stay. */
export async function restoreRevision(
	user: SessionUser | null,
	setupId: string,
	number: number,
	input: { message?: string; baseRevision?: number } = {}
): Promise<{ revisionNumber: number }> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.edit');
	const { revision } = await loadRevision(setup, number);
	const read = readStoredDocument(revision.document);
	const document = read.documentIssues ? (revision.document as SetupDocument) : read.document;
	const outcome = await appendRevision(setup.id, input.baseRevision ?? null, {
		document,
		title: setup.title,
		subject: setup.subject,
		tags: setup.tags,
		gearIds: read.documentIssues ? setup.gearIds : referencedGearIds(document),
		searchText: read.documentIssues
			? setup.searchText
			: searchTextOf(setup.title, setup.subject, setup.tags, document),
		message: input.message || `Restored revision ${number}`,
		authorId: user!.id,
		restoredFromNumber: number,
		thumbnailPng: revision.thumbnailPng
	});
	if (outcome.outcome === 'stale') throw new StaleRevisionError(outcome.latestRevision);
	if (outcome.outcome === 'missing') error(404, SETUP_NOT_FOUND);
	return { revisionNumber: outcome.revisionNumber };
}

/**
 * A new setup for a new subject, starting from a revision of this one (the latest by default). It goes
 * to `input.studioId`, else to this setup's studio when the caller may edit there, else to the caller's
 * personal studio; it remembers where it came from.
 */
export async function duplicateSetup(
	user: SessionUser | null,
	setupId: string,
	input: SetupDuplicateInput
): Promise<DuplicateResult> {
	const { setup, access } = await authorizeSetup(user, setupId, 'setups.duplicateFrom');
	const signedIn = user!;
	const number = input.revisionNumber ?? setup.latestRevision;
	const targetStudioId =
		input.studioId ?? (can(access, 'setups.edit') ? setup.studioId : await personalStudioId(signedIn));
	return duplicateRevision(signedIn, setup, number, { ...input, studioId: targetStudioId });
}

export type DuplicateResult = { id: string; revisionNumber: 1; derivedFrom: { setupId: string; revisionNumber: number }; studioId: string };

/**
 * The duplicate itself, once the caller's right to read revision `number` is settled (by authz on the
 * setup, or by a workshop step that pins it): a new setup in `input.studioId`, where the caller must be
 * able to edit, with lineage back to the revision. `shape` may change the document first (a workshop
 * step copies what it shows).
 */
export async function duplicateRevision(
	signedIn: SessionUser,
	setup: Setup,
	number: number,
	input: Omit<SetupDuplicateInput, 'studioId' | 'revisionNumber'> & { studioId: string },
	shape: (document: SetupDocument) => SetupDocument = (d) => d
): Promise<DuplicateResult> {
	const { revision } = await loadRevision(setup, number);
	const read = readStoredDocument(revision.document);
	if (read.documentIssues) {
		throw new InputError(`Revision ${number} cannot be duplicated: its document does not pass today's checks.`, read.documentIssues);
	}
	await authorizeStudio(signedIn, input.studioId, 'setups.edit');
	const document = shape(read.document);
	const title = input.title ?? setup.title;
	const created = await insertSetup({
		studioId: input.studioId,
		title,
		subject: input.subject,
		tags: setup.tags,
		document,
		gearIds: referencedGearIds(document),
		searchText: searchTextOf(title, input.subject, setup.tags, document),
		message: `Duplicated from “${setup.title}”, revision ${number}, for ${input.subject}`,
		authorId: signedIn.id,
		thumbnailPng: document === read.document ? revision.thumbnailPng : null,
		derivedFromSetupId: setup.id,
		derivedFromRevision: number
	});
	return { id: created.id, revisionNumber: 1, derivedFrom: { setupId: setup.id, revisionNumber: number }, studioId: input.studioId };
}

/** To the studio's trash: the setup leaves the notebook, every revision stays. */
export async function trashSetup(user: SessionUser | null, setupId: string): Promise<void> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.edit');
	if (!(await trashSetupRow(setup.id, user!.id))) error(404, SETUP_NOT_FOUND);
}

/** Out of the trash, with every revision it had. */
export async function untrashSetup(user: SessionUser | null, setupId: string): Promise<{ id: string; revisionNumber: number }> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.edit', { includeTrashed: true });
	if (!setup.deletedAt) throw new RuleViolation('This setup is not in the trash.', 'id');
	const row = await untrashSetupRow(setup.id);
	if (!row) throw new RuleViolation('This setup is not in the trash.', 'id');
	return row;
}
