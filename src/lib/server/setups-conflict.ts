// A stale save's account of what changed since the revision it started from: the saves made since,
// what they changed in words, and the notes, title and tags as they are now. It rides on the 409 (API
// and page forms alike), so a page shows it without asking again.
import { findRevision, findSetup, listRevisions } from '$lib/server/db/queries/setups';
import { readStoredDocument } from '$lib/server/setups-documents';
import { describeConflict, type Conflict } from '$lib/notebook/save';
import type { UnitSystem } from '$lib/light/format';

/** Null when the base revision or the setup cannot be read (the 409 then carries `latestRevision` only). */
export async function conflictSince(setupId: string, baseRevision: number, unitSystem: UnitSystem): Promise<Conflict | null> {
	const [base, current, revisions] = await Promise.all([findRevision(setupId, baseRevision), findSetup(setupId), listRevisions(setupId)]);
	if (!base || !current) return null;
	const latest = await findRevision(setupId, current.setup.latestRevision);
	if (!latest) return null;
	return describeConflict({
		baseRevision,
		baseDocument: readStoredDocument(base.revision.document).document,
		latest: {
			revisionNumber: current.setup.latestRevision,
			document: readStoredDocument(latest.revision.document).document,
			title: current.setup.title,
			subject: current.setup.subject,
			tags: current.setup.tags
		},
		revisions: revisions.map((r) => ({ number: r.number, authorName: r.authorName, createdAt: r.createdAt.toISOString(), message: r.message })),
		unitSystem
	});
}
