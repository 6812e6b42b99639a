/**
 * Saving a change to a setup from a page form: read the revision the form started from, apply the
 * change to its document, save it with that `baseRevision` (checked by the same schema as the API's
 * PUT). When someone else saved first, the outcome carries what changed since (the 409's `conflict`),
 * so the page can show it beside what the user typed and let them save on top.
 */
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import { getSetupRevision, InputError, saveSetup, StaleRevisionError } from '$lib/server/setups';
import { setupSaveSchema } from '$lib/scene/inputs';
import type { SetupDocument } from '$lib/scene/document';
import type { Conflict } from '$lib/notebook/save';

export interface SaveIssue {
	path: string[];
	message: string;
}

export type SaveOutcome =
	| { kind: 'saved'; revisionNumber: number }
	| { kind: 'conflict'; conflict: Conflict }
	| { kind: 'invalid'; status: number; message: string; issues: SaveIssue[] };

export interface SaveRequest {
	setupId: string;
	baseRevision: number;
	/** Returns the new document from the base one (a copy: change it freely). */
	apply: (document: SetupDocument) => SetupDocument;
	title?: string;
	subject?: string;
	tags?: string[];
	message?: string;
}

/** A refusal (401, 403, 404) is thrown as the service throws it; everything else is an outcome. */
export async function saveChange(user: SessionUser | null, req: SaveRequest): Promise<SaveOutcome> {
	const base = await getSetupRevision(user, req.setupId, req.baseRevision);
	const parsed = setupSaveSchema.safeParse({
		baseRevision: req.baseRevision,
		document: req.apply(structuredClone(base.document)),
		title: req.title,
		subject: req.subject,
		tags: req.tags,
		message: req.message || undefined
	});
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message }));
		return { kind: 'invalid', status: 400, message: `Invalid input. ${issues[0].path.join('.')}: ${issues[0].message}`, issues };
	}
	try {
		return { kind: 'saved', ...(await saveSetup(user, req.setupId, parsed.data)) };
	} catch (e) {
		if (e instanceof StaleRevisionError) {
			return e.conflict ? { kind: 'conflict', conflict: e.conflict } : { kind: 'invalid', status: 409, message: e.message, issues: [] };
		}
		if (e instanceof InputError) return { kind: 'invalid', status: e.status, message: e.message, issues: e.issues.map((i) => ({ path: i.path.map(String), message: i.message })) };
		if (e instanceof RuleViolation) return { kind: 'invalid', status: e.status, message: e.message, issues: e.field ? [{ path: [e.field], message: e.message }] : [] };
		throw e;
	}
}
