/**
 * Saving a change to a setup from a page form: read the revision the form started from, apply the
 * change to its document, PUT it with that `baseRevision`. When someone else saved first (409), say
 * what changed since, so the page can show it beside what the user typed and let them save on top.
 */
import type { SetupDocument } from '$lib/scene/document';
import { callApi, type ApiIssue, type Fetch, type RevisionRecord, type RevisionSummary, type SetupRecord } from './api';
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

export type SaveOutcome =
	| { kind: 'saved'; revisionNumber: number }
	| { kind: 'conflict'; conflict: Conflict }
	| { kind: 'invalid'; status: number; message: string; issues: ApiIssue[] };

export interface SaveRequest {
	setupId: string;
	baseRevision: number;
	/** Returns the new document from the base one (a copy: change it freely). */
	apply: (document: SetupDocument) => SetupDocument;
	title?: string;
	subject?: string;
	tags?: string[];
	message?: string;
	unitSystem: UnitSystem;
}

export async function saveChange(fetchFn: Fetch, req: SaveRequest): Promise<SaveOutcome> {
	const base = await callApi<RevisionRecord>(fetchFn, `/api/v1/setups/${req.setupId}/revisions/${req.baseRevision}`);
	if (!base.ok) return { kind: 'invalid', status: base.status, message: base.message, issues: base.issues };
	const document = req.apply(structuredClone(base.data.document));
	const body: Record<string, unknown> = { baseRevision: req.baseRevision, document };
	if (req.title !== undefined) body.title = req.title;
	if (req.subject !== undefined) body.subject = req.subject;
	if (req.tags !== undefined) body.tags = req.tags;
	if (req.message) body.message = req.message;
	const put = await callApi<{ revisionNumber: number }>(fetchFn, `/api/v1/setups/${req.setupId}`, { method: 'PUT', body });
	if (put.ok) return { kind: 'saved', revisionNumber: put.data.revisionNumber };
	if (put.status === 409) {
		const latestRevision = Number(put.body?.latestRevision);
		return { kind: 'conflict', conflict: await describeConflict(fetchFn, req, base.data.document, latestRevision) };
	}
	return { kind: 'invalid', status: put.status, message: put.message, issues: put.issues };
}

/** What changed between revision `baseRevision` and the latest, for a save that was refused (409); used by the editor too. */
export async function conflictSince(
	fetchFn: Fetch,
	req: Pick<SaveRequest, 'setupId' | 'baseRevision' | 'unitSystem'>,
	latestHint: number
): Promise<Conflict | null> {
	const base = await callApi<RevisionRecord>(fetchFn, `/api/v1/setups/${req.setupId}/revisions/${req.baseRevision}`);
	if (!base.ok) return null;
	return describeConflict(fetchFn, req, base.data.document, latestHint);
}

async function describeConflict(
	fetchFn: Fetch,
	req: Pick<SaveRequest, 'setupId' | 'baseRevision' | 'unitSystem'>,
	baseDoc: SetupDocument,
	latestHint: number
): Promise<Conflict> {
	const [latest, revisions] = await Promise.all([
		callApi<SetupRecord>(fetchFn, `/api/v1/setups/${req.setupId}`),
		callApi<RevisionSummary[]>(fetchFn, `/api/v1/setups/${req.setupId}/revisions`)
	]);
	const latestRevision = latest.ok ? latest.data.revisionNumber : latestHint;
	const latestDoc = latest.ok ? latest.data.document : baseDoc;
	const since = revisions.ok ? revisions.data.filter((r) => r.number > req.baseRevision) : [];
	const comparison = compareDocuments(baseDoc, latestDoc, { unitSystem: req.unitSystem });
	const changes = comparisonSentences(comparison);
	if (latest.ok && changes.length === 0) changes.push('Only the title, subject or tags changed, or nothing that shows in the plan.');
	return {
		baseRevision: req.baseRevision,
		latestRevision,
		revisions: since.map((r) => ({ number: r.number, authorName: r.authorName, createdAt: r.createdAt, message: r.message })),
		changes,
		latestNotes: latestDoc.notes ?? '',
		notesSinceBase: diffLines(baseDoc.notes ?? '', latestDoc.notes ?? ''),
		latestTitle: latest.ok ? latest.data.title : '',
		latestSubject: latest.ok ? latest.data.subject : '',
		latestTags: latest.ok ? latest.data.tags : []
	};
}
