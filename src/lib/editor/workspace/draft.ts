/**
 * The local draft of a setup's plan: work in progress kept in this browser until it is saved, keyed by
 * setup id, with the revision it started from (so a save after a reload still knows its base).
 */
import type { SetupDocument } from '$lib/editor';

export interface PlanDraft {
	baseRevision: number;
	document: SetupDocument;
	keptAt: string;
}

const key = (setupId: string) => `squarelaw:plan-draft:${setupId}`;

export function readDraft(setupId: string): PlanDraft | null {
	try {
		const raw = localStorage.getItem(key(setupId));
		if (!raw) return null;
		const d = JSON.parse(raw) as PlanDraft;
		return d && typeof d.baseRevision === 'number' && d.document?.scene ? d : null;
	} catch {
		return null;
	}
}

export function writeDraft(setupId: string, draft: PlanDraft) {
	try {
		localStorage.setItem(key(setupId), JSON.stringify(draft));
	} catch {
		// Storage full or refused (private mode): the page keeps working, only the draft is not kept.
	}
}

export function clearDraft(setupId: string) {
	try {
		localStorage.removeItem(key(setupId));
	} catch {
		/* nothing kept, nothing to clear */
	}
}

/**
 * Writes the draft a moment from now, so a burst of edits makes one write; returns the cancel, for an
 * `$effect` to return: `$effect(() => writeDraftSoon(id, () => draft))`.
 */
export function writeDraftSoon(setupId: string, draft: () => PlanDraft, delayMs = 300): () => void {
	const t = setTimeout(() => writeDraft(setupId, draft()), delayMs);
	return () => clearTimeout(t);
}
