/**
 * What a stale save (409) tells the person saving: the saves made since the revision they started from,
 * what those changed, and the notes, title and tags as they are now. Worked out on the server
 * (`$lib/server/setups-conflict.ts`) and sent with the 409, so pages and the editor show it as it came.
 */
import type { SetupDocument } from '$lib/scene/document';
import { compareDocuments, comparisonSentences, diffLines, type LineDiffOp } from './compare/index';
import type { UnitSystem } from '$lib/light/format';

export interface Conflict {
	baseRevision: number;
	latestRevision: number;
	/** The saves made since the base, newest first. */
	revisions: { number: number; authorName: string | null; createdAt: string; message: string | null }[];
	/** What those saves changed, in words. */
	changes: string[];
	/** The notes as they are now, and how they differ from the base. */
	latestNotes: string;
	notesSinceBase: LineDiffOp[];
	latestTitle: string;
	latestSubject: string;
	latestTags: string[];
}

/** What a setup page's save action answers, for the form that sent it (`action` names the form). */
export interface SaveFormState {
	action?: string;
	/** The revision the save made. */
	saved?: number;
	values?: Record<string, string>;
	errors?: Record<string, string>;
	conflict?: Conflict;
}

export interface ConflictInput {
	baseRevision: number;
	baseDocument: SetupDocument;
	latest: { revisionNumber: number; document: SetupDocument; title: string; subject: string; tags: string[] };
	/** Every revision of the setup (those after the base are kept). */
	revisions: Conflict['revisions'];
	unitSystem: UnitSystem;
}

export function describeConflict({ baseRevision, baseDocument, latest, revisions, unitSystem }: ConflictInput): Conflict {
	const changes = comparisonSentences(compareDocuments(baseDocument, latest.document, { unitSystem }));
	if (changes.length === 0) changes.push('Only the title, subject or tags changed, or nothing that shows in the plan.');
	return {
		baseRevision,
		latestRevision: latest.revisionNumber,
		revisions: revisions.filter((r) => r.number > baseRevision),
		changes,
		latestNotes: latest.document.notes ?? '',
		notesSinceBase: diffLines(baseDocument.notes ?? '', latest.document.notes ?? ''),
		latestTitle: latest.title,
		latestSubject: latest.subject,
		latestTags: latest.tags
	};
}
