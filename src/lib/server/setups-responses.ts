// The setups API's answers: database rows turned into the JSON that API.md and the pages read.
import type { SetupListRow, listRevisions, findRevision } from '$lib/server/db/queries/setups';
import type { Setup, SetupRevision } from '$lib/server/db/schema';
import type { SetupAccess } from '$lib/server/authz';
import { readStoredDocument, type ReadDocument } from '$lib/server/setups-documents';

/** What names a setup in a list and on its page: its catalogue fields and its studio. */
export interface SetupCard {
	id: string;
	title: string;
	subject: string;
	tags: string[];
	studioId: string;
	studioName: string;
}

export interface SetupListItem extends SetupCard {
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

function setupCard(setup: Pick<Setup, 'id' | 'title' | 'subject' | 'tags' | 'studioId'>, studioName: string): SetupCard {
	return { id: setup.id, title: setup.title, subject: setup.subject, tags: setup.tags, studioId: setup.studioId, studioName };
}

export function listItem(row: SetupListRow, trashed = false): SetupListItem {
	return {
		...setupCard(row, row.studioName),
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


export interface SetupDetail extends ReadDocument, SetupCard {
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

export function setupDetail(
	{ setup, studioName, canEdit, canDuplicate }: SetupAccess,
	read: ReadDocument,
	derivedFrom: SetupDetail['derivedFrom'],
	derivatives: SetupDetail['derivatives']
): SetupDetail {
	return {
		...setupCard(setup, studioName),
		revisionNumber: setup.latestRevision,
		createdAt: setup.createdAt.toISOString(),
		updatedAt: setup.updatedAt.toISOString(),
		...read,
		derivedFrom,
		derivatives,
		thumbnailRevision: setup.thumbnailRevision,
		gearIds: setup.gearIds,
		canEdit,
		canDuplicate
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

type RevisionFields = Pick<SetupRevision, 'number' | 'authorId' | 'createdAt' | 'message' | 'parentNumber' | 'restoredFromNumber' | 'title'>;

/** A revision's own fields, as the list and the single revision both answer them. */
function revisionFields(r: RevisionFields, authorName: string | null): Omit<RevisionSummary, 'hasThumbnail'> {
	return {
		number: r.number,
		authorName,
		authorId: r.authorId,
		createdAt: r.createdAt.toISOString(),
		message: r.message,
		parentNumber: r.parentNumber,
		restoredFrom: r.restoredFromNumber,
		title: r.title
	};
}

export function revisionSummary(r: Awaited<ReturnType<typeof listRevisions>>[number]): RevisionSummary {
	return { ...revisionFields(r, r.authorName), hasThumbnail: r.hasThumbnail };
}

export interface RevisionDetail extends ReadDocument, Omit<RevisionSummary, 'hasThumbnail'> {
	setupId: string;
	subject: string;
	tags: string[];
	hasThumbnail: boolean;
	isLatest: boolean;
}

export function revisionDetail(setup: Setup, { revision: r, authorName }: NonNullable<Awaited<ReturnType<typeof findRevision>>>): RevisionDetail {
	return {
		setupId: setup.id,
		...revisionFields(r, authorName),
		subject: r.subject,
		tags: r.tags,
		hasThumbnail: r.thumbnailPng !== null,
		isLatest: r.number === setup.latestRevision,
		...readStoredDocument(r.document)
	};
}
