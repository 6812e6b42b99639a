// The notebook's rules: who may do what is asked of authz; what must stay true (every save is a new
// revision, a stale save never overwrites, gear copies never change, lineage is recorded) is kept here.
// Pages and API routes call these functions; inputs arrive parsed by the schemas in $lib/scene.
import { error } from '@sveltejs/kit';
import { authorizeStudio, can, isUuid, requireUser, studioAccess, type Capability, type StudioAccess } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import { ensurePersonalStudio, listStudiosForUser } from '$lib/server/db/queries/studios';
import {
	appendRevision,
	findRevision,
	findSetup,
	insertSetup,
	listDerivatives,
	listRevisions,
	listSetups,
	revisionThumbnail,
	trashSetupRow,
	untrashSetupRow,
	type SetupListRow
} from '$lib/server/db/queries/setups';
import { gearRowsByIds } from '$lib/server/db/queries/gear';
import type { Setup } from '$lib/server/db/schema';
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { findNonFinite } from '$lib/light/finite';
import {
	elementUsingGear,
	referencedGearIds,
	type GearSnapshot,
	type SetupDocument
} from '$lib/scene/document';
import { migrateDocument, type DocumentIssue } from '$lib/scene/migrations';
import { MAX_DOCUMENT_DEPTH, trimJson } from '$lib/json-limits';
import type {
	SetupCreateInput,
	SetupDuplicateInput,
	SetupListQuery,
	SetupSaveInput
} from '$lib/scene/inputs';
import { buildSetupExport, exportFileName, parseSetupExport, type SetupExport } from '$lib/scene/export';

/** A save on a revision that is no longer the latest: 409 with `latestRevision`. */
export class StaleRevisionError extends RuleViolation {
	readonly extra: { latestRevision: number };
	constructor(readonly latestRevision: number) {
		super(
			`This setup has changed since the revision you started from: revision ${latestRevision} is the latest. Reload it, then save again.`,
			'baseRevision',
			409
		);
		this.extra = { latestRevision };
	}
}

/** Bad input found below the edge (a gear id the shelf does not know, an import file): 400 with issues. */
export class InputError extends RuleViolation {
	constructor(
		message: string,
		readonly issues: DocumentIssue[]
	) {
		super(message, issues[0]?.path.join('.') || null, 400);
	}
}

const NOT_FOUND = 'No such setup.';

export interface SetupAccess {
	setup: Setup;
	studioName: string;
	access: StudioAccess;
}

/**
 * The caller's standing toward one setup: 401 when anonymous, 404 when the setup does not exist, is in
 * the trash, or lies in a studio the caller cannot see (never revealing which), 403 when the caller sees
 * it but their role lacks `capability`.
 */
export async function authorizeSetup(
	user: SessionUser | null,
	setupId: string,
	capability: Capability,
	{ includeTrashed = false } = {}
): Promise<SetupAccess> {
	const signedIn = requireUser(user);
	if (!isUuid(setupId)) error(404, NOT_FOUND);
	const row = await findSetup(setupId, { includeTrashed });
	if (!row) error(404, NOT_FOUND);
	const access = await studioAccess(signedIn, row.setup.studioId);
	if (!access || !can(access, 'setups.view')) error(404, NOT_FOUND);
	if (!can(access, capability)) error(403, `Your role in this studio does not allow that (${capability}).`);
	return { setup: row.setup, studioName: row.studioName, access };
}

/** The studios whose setups the caller may see (with `capability`): ids, or 'all' for a site admin. */
async function studiosWith(user: SessionUser, capability: Capability): Promise<string[] | 'all'> {
	if (user.isAdmin) return 'all';
	const mine = await listStudiosForUser(user.id);
	return mine
		.filter((s) => can({ studioId: s.id, studioName: s.name, isPersonal: s.personal, role: s.role, isAdmin: false }, capability))
		.map((s) => s.id);
}

async function personalStudioId(user: SessionUser) {
	const studio = await ensurePersonalStudio(user.id, user.name || user.email.split('@')[0] || 'My');
	return studio.id;
}

// ---------- documents ----------

export interface ReadDocument {
	document: SetupDocument;
	/** Set when the stored document no longer passes today's checks; it is shown as stored, never lost. */
	documentIssues?: DocumentIssue[];
	/** Parts nested too deep to show (stored before the limit existed), left out of `document`. */
	documentTrimmed?: string[][];
	migratedFrom?: number;
}

/**
 * A stored document, migrated to the current schemaVersion. One that nests deeper than a document may
 * (stored before that limit) is read without the too-deep parts, which no page could render.
 */
export function readStoredDocument(raw: unknown): ReadDocument {
	const result = migrateDocument(raw);
	if (result.ok) return { document: result.document, ...(result.migratedFrom !== null ? { migratedFrom: result.migratedFrom } : {}) };
	const trimmed = trimJson(raw, MAX_DOCUMENT_DEPTH);
	if (!trimmed.dropped.length) return { document: raw as SetupDocument, documentIssues: result.issues };
	const again = migrateDocument(trimmed.value);
	return again.ok
		? { document: again.document, documentTrimmed: trimmed.dropped }
		: { document: trimmed.value as SetupDocument, documentIssues: again.issues, documentTrimmed: trimmed.dropped };
}

function searchTextOf(title: string, subject: string, tags: string[], document: SetupDocument) {
	return [title, subject, ...tags, ...document.gear.map((g) => g.name)].join(' ').toLowerCase();
}

/**
 * Fills `document.gear` with a copy of every gear item the plan refers to. A copy already in the base
 * revision is carried forward unchanged (unless the gear id is in `refresh`); gear newly attached is
 * copied from the studio's shelf now; gear that is not on this studio's shelf keeps the copy that came
 * with the document (an imported or duplicated setup). Copies no element refers to are dropped.
 */
export async function snapshotGear(
	studioId: string,
	document: SetupDocument,
	base: SetupDocument | null,
	refresh: string[] = []
): Promise<SetupDocument> {
	const ids = referencedGearIds(document);
	const fromBase = new Map((base?.gear ?? []).map((g) => [g.id, g]));
	const fromClient = new Map(document.gear.map((g) => [g.id, g]));
	const shelf = new Map((await gearRowsByIds(studioId, ids)).map((g) => [g.id, g]));
	const copiedAt = new Date().toISOString();
	const gear: GearSnapshot[] = [];
	const issues: DocumentIssue[] = [];
	for (const id of ids) {
		const kept = fromBase.get(id);
		const onShelf = shelf.get(id);
		if (kept && !(refresh.includes(id) && onShelf)) gear.push(kept);
		else if (onShelf) gear.push({ id, kind: onShelf.kind, name: onShelf.name, spec: onShelf.spec, copiedAt });
		else if (fromClient.has(id)) gear.push(fromClient.get(id)!);
		else {
			issues.push({
				path: ['document', 'plan', 'elements', elementUsingGear(document, id) ?? '?', 'gearId'],
				message: `names no gear on this studio's shelf (${id})`
			});
		}
	}
	if (issues.length) throw new InputError(`Invalid input. ${issues[0].path.join('.')}: ${issues[0].message}`, issues);
	return { ...document, gear };
}

// ---------- list ----------

export interface SetupListItem {
	id: string;
	title: string;
	subject: string;
	tags: string[];
	studioId: string;
	studioName: string;
	createdAt: string;
	updatedAt: string;
	revisionNumber: number;
	derivedFrom: { setupId: string; revisionNumber: number } | null;
	/** The revision whose plan thumbnail to show (GET …/revisions/:n/thumbnail), or null. */
	thumbnailRevision: number | null;
	gearIds: string[];
	deletedAt?: string;
	deletedByName?: string | null;
}

function listItem(row: SetupListRow, trashed = false): SetupListItem {
	return {
		id: row.id,
		title: row.title,
		subject: row.subject,
		tags: row.tags,
		studioId: row.studioId,
		studioName: row.studioName,
		createdAt: row.createdAt.toISOString(),
		updatedAt: row.updatedAt.toISOString(),
		revisionNumber: row.revisionNumber,
		derivedFrom:
			row.derivedFromSetupId && row.derivedFromRevision
				? { setupId: row.derivedFromSetupId, revisionNumber: row.derivedFromRevision }
				: null,
		thumbnailRevision: row.thumbnailRevision,
		gearIds: row.gearIds,
		...(trashed ? { deletedAt: row.deletedAt?.toISOString(), deletedByName: row.deletedByName } : {})
	};
}

export interface SetupListPage {
	items: SetupListItem[];
	total: number;
	page: number;
	pageSize: number;
}

/** The notebook: setups of one studio (`query.studio`) or of every studio the caller can view. */
export async function listSetupsFor(user: SessionUser | null, query: SetupListQuery): Promise<SetupListPage> {
	const signedIn = requireUser(user);
	const studioIds = query.studio ? [(await authorizeStudio(signedIn, query.studio, 'setups.view')).studioId] : await studiosWith(signedIn, 'setups.view');
	const { items, total } = await listSetups({ ...query, gearId: query.gear, studioIds });
	return { items: items.map((r) => listItem(r)), total, page: query.page, pageSize: query.pageSize };
}

/** The trash: deleted setups of one studio, or of every studio where the caller may edit (and so restore). */
export async function listTrash(user: SessionUser | null, query: SetupListQuery): Promise<SetupListPage> {
	const signedIn = requireUser(user);
	const studioIds = query.studio ? [(await authorizeStudio(signedIn, query.studio, 'setups.edit')).studioId] : await studiosWith(signedIn, 'setups.edit');
	const { items, total } = await listSetups({ ...query, gearId: query.gear, studioIds, trashed: true });
	return { items: items.map((r) => listItem(r, true)), total, page: query.page, pageSize: query.pageSize };
}

// ---------- read ----------

export interface SetupDetail extends ReadDocument {
	id: string;
	title: string;
	subject: string;
	tags: string[];
	studioId: string;
	studioName: string;
	revisionNumber: number;
	createdAt: string;
	updatedAt: string;
	derivedFrom: { setupId: string; revisionNumber: number; title?: string } | null;
	derivatives: { id: string; title: string; subject: string; studioId: string; revisionNumber: number | null }[];
	thumbnailRevision: number | null;
	gearIds: string[];
	/** What the caller may do here, so pages can offer only what will work. */
	canEdit: boolean;
	canDuplicate: boolean;
}

export async function getSetup(user: SessionUser | null, setupId: string): Promise<SetupDetail> {
	const { setup, studioName, access } = await authorizeSetup(user, setupId, 'setups.view');
	const [latest, visible] = await Promise.all([findRevision(setup.id, setup.latestRevision), studiosWith(user!, 'setups.view')]);
	if (!latest) error(404, NOT_FOUND);
	let derivedFrom: SetupDetail['derivedFrom'] = null;
	if (setup.derivedFromSetupId && setup.derivedFromRevision) {
		derivedFrom = { setupId: setup.derivedFromSetupId, revisionNumber: setup.derivedFromRevision };
		// The origin's title only for a caller who may see the origin.
		const origin = await findSetup(setup.derivedFromSetupId);
		if (origin && (visible === 'all' || visible.includes(origin.setup.studioId))) derivedFrom.title = origin.setup.title;
	}
	return {
		id: setup.id,
		title: setup.title,
		subject: setup.subject,
		tags: setup.tags,
		studioId: setup.studioId,
		studioName,
		revisionNumber: setup.latestRevision,
		createdAt: setup.createdAt.toISOString(),
		updatedAt: setup.updatedAt.toISOString(),
		...readStoredDocument(latest.revision.document),
		derivedFrom,
		derivatives: await listDerivatives(setup.id, visible),
		thumbnailRevision: setup.thumbnailRevision,
		gearIds: setup.gearIds,
		canEdit: can(access, 'setups.edit'),
		canDuplicate: can(access, 'setups.duplicateFrom')
	};
}

export interface RevisionSummary {
	number: number;
	authorName: string | null;
	authorId: string | null;
	createdAt: string;
	message: string;
	parentNumber: number | null;
	restoredFrom: number | null;
	title: string;
	hasThumbnail: boolean;
}

export async function listSetupRevisions(user: SessionUser | null, setupId: string): Promise<RevisionSummary[]> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.view');
	const rows = await listRevisions(setup.id);
	return rows.map((r) => ({
		number: r.number,
		authorName: r.authorName,
		authorId: r.authorId,
		createdAt: r.createdAt.toISOString(),
		message: r.message,
		parentNumber: r.parentNumber,
		restoredFrom: r.restoredFromNumber,
		title: r.title,
		hasThumbnail: r.hasThumbnail
	}));
}

export interface RevisionDetail extends ReadDocument, Omit<RevisionSummary, 'hasThumbnail'> {
	setupId: string;
	subject: string;
	tags: string[];
	hasThumbnail: boolean;
	isLatest: boolean;
}

async function loadRevision(setup: Setup, number: number) {
	const row = await findRevision(setup.id, number);
	if (!row) error(404, `This setup has no revision ${number}.`);
	return row;
}

export async function getSetupRevision(user: SessionUser | null, setupId: string, number: number): Promise<RevisionDetail> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.view');
	const { revision: r, authorName } = await loadRevision(setup, number);
	return {
		setupId: setup.id,
		number: r.number,
		authorName,
		authorId: r.authorId,
		createdAt: r.createdAt.toISOString(),
		message: r.message,
		parentNumber: r.parentNumber,
		restoredFrom: r.restoredFromNumber,
		title: r.title,
		subject: r.subject,
		tags: r.tags,
		hasThumbnail: r.thumbnailPng !== null,
		isLatest: r.number === setup.latestRevision,
		...readStoredDocument(r.document)
	};
}

export async function getRevisionThumbnail(user: SessionUser | null, setupId: string, number: number): Promise<Uint8Array> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.view');
	const png = await revisionThumbnail(setup.id, number);
	if (!png) error(404, `Revision ${number} of this setup has no thumbnail.`);
	return png;
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
	const read = readStoredDocument(revision.document);
	if (read.documentIssues) {
		error(422, `Revision ${revisionNumber} cannot be computed: its document does not pass today's checks (${read.documentIssues[0].path.join('.')}: ${read.documentIssues[0].message}).`);
	}
	const result = computeExposure(read.document.scene);
	const bad = findNonFinite(result);
	if (bad) error(422, `Revision ${revisionNumber} gives a result that is not a finite number (${bad.join('.')}); check its scene.`);
	return { ...result, revisionNumber };
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
	if (input.baseRevision !== setup.latestRevision) throw new StaleRevisionError(setup.latestRevision);
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
	if (outcome.outcome === 'stale') throw new StaleRevisionError(outcome.latestRevision);
	if (outcome.outcome === 'missing') error(404, NOT_FOUND);
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
	if (outcome.outcome === 'missing') error(404, NOT_FOUND);
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
): Promise<{ id: string; revisionNumber: 1; derivedFrom: { setupId: string; revisionNumber: number }; studioId: string }> {
	const { setup, access } = await authorizeSetup(user, setupId, 'setups.duplicateFrom');
	const signedIn = user!;
	const number = input.revisionNumber ?? setup.latestRevision;
	const { revision } = await loadRevision(setup, number);
	const read = readStoredDocument(revision.document);
	if (read.documentIssues) {
		throw new InputError(`Revision ${number} cannot be duplicated: its document does not pass today's checks.`, read.documentIssues);
	}
	const targetStudioId =
		input.studioId ?? (can(access, 'setups.edit') ? setup.studioId : await personalStudioId(signedIn));
	await authorizeStudio(signedIn, targetStudioId, 'setups.edit');
	const title = input.title ?? setup.title;
	const created = await insertSetup({
		studioId: targetStudioId,
		title,
		subject: input.subject,
		tags: setup.tags,
		document: read.document,
		gearIds: referencedGearIds(read.document),
		searchText: searchTextOf(title, input.subject, setup.tags, read.document),
		message: `Duplicated from “${setup.title}”, revision ${number}, for ${input.subject}`,
		authorId: signedIn.id,
		thumbnailPng: revision.thumbnailPng,
		derivedFromSetupId: setup.id,
		derivedFromRevision: number
	});
	return { id: created.id, revisionNumber: 1, derivedFrom: { setupId: setup.id, revisionNumber: number }, studioId: targetStudioId };
}

/** To the studio's trash: the setup leaves the notebook, every revision stays. */
export async function trashSetup(user: SessionUser | null, setupId: string): Promise<void> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.edit');
	if (!(await trashSetupRow(setup.id, user!.id))) error(404, NOT_FOUND);
}

/** Out of the trash, with every revision it had. */
export async function untrashSetup(user: SessionUser | null, setupId: string): Promise<{ id: string; revisionNumber: number }> {
	const { setup } = await authorizeSetup(user, setupId, 'setups.edit', { includeTrashed: true });
	if (!setup.deletedAt) throw new RuleViolation('This setup is not in the trash.', 'id');
	const row = await untrashSetupRow(setup.id);
	if (!row) throw new RuleViolation('This setup is not in the trash.', 'id');
	return row;
}

// ---------- export and import ----------

export async function exportSetup(
	user: SessionUser | null,
	setupId: string,
	number?: number
): Promise<{ file: SetupExport; fileName: string }> {
	const { setup, studioName } = await authorizeSetup(user, setupId, 'setups.view');
	const revisionNumber = number ?? setup.latestRevision;
	const { revision } = await loadRevision(setup, revisionNumber);
	const read = readStoredDocument(revision.document);
	const file = buildSetupExport({
		title: revision.title,
		subject: revision.subject,
		tags: revision.tags,
		document: read.document,
		source: { setupId: setup.id, revisionNumber, studioName }
	});
	return { file, fileName: exportFileName(revision.title, revisionNumber) };
}

/** A setup made from an export file's text. A bad file creates nothing and says what is wrong. */
export async function importSetup(
	user: SessionUser | null,
	text: string,
	options: { studioId?: string } = {}
): Promise<{ id: string; revisionNumber: 1 }> {
	const signedIn = requireUser(user);
	const studioId = options.studioId ?? (await personalStudioId(signedIn));
	await authorizeStudio(signedIn, studioId, 'setups.edit');
	const parsed = parseSetupExport(text);
	if (!parsed.ok) throw new InputError(parsed.message, parsed.issues);
	const file = parsed.value;
	return createSetup(signedIn, {
		studioId,
		title: file.title,
		subject: file.subject,
		tags: file.tags,
		document: file.document,
		message: `Imported from a file exported ${file.exportedAt.slice(0, 10)}`
	});
}
