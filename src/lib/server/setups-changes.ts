/**
 * Page forms that write setups, with the schemas and services of the JSON routes. A new setup from a
 * new-setup form. A change to a setup: read the revision the form started from, apply the change to
 * its document, save it with that `baseRevision` (checked by the same schema as the API's PUT). When
 * someone else saved first, the outcome carries what changed since (the 409's `conflict`), so the page
 * can show it beside what the user typed and let them save on top.
 */
import { RuleViolation } from '$lib/server/errors';
import { attempt, parseInput } from '$lib/server/actions';
import type { SessionUser } from '$lib/server/session';
import { createSetup, getSetupRevision, saveSetup, StaleRevisionError } from '$lib/server/setups';
import { setupCreateSchema, setupSaveSchema } from '$lib/scene/inputs';
import type { SetupDocument } from '$lib/scene/document';
import type { Conflict } from '$lib/notebook/save';
import { newSetupErrors, newSetupInput, newSetupProblems, type CreateOutcome, type NewSetupValues } from '$lib/notebook/create';

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
	const parsed = parseInput(setupSaveSchema, {
		baseRevision: req.baseRevision,
		document: req.apply(structuredClone(base.document)),
		title: req.title,
		subject: req.subject,
		tags: req.tags,
		message: req.message || undefined
	});
	if (!parsed.ok) return { kind: 'invalid', status: parsed.status, message: parsed.message, issues: parsed.issues };
	try {
		return { kind: 'saved', ...(await saveSetup(user, req.setupId, parsed.data)) };
	} catch (e) {
		if (e instanceof StaleRevisionError) {
			return e.conflict ? { kind: 'conflict', conflict: e.conflict } : { kind: 'invalid', status: 409, message: e.message, issues: [] };
		}
		// InputError's issues name every field at fault; any other broken rule names its one field.
		if (e instanceof RuleViolation) return { kind: 'invalid', status: e.status, message: e.message, issues: e.issues };
		throw e;
	}
}

/** The new-setup form posted to a page (the notebook's, the editor's without JavaScript): the checks and service of POST /api/v1/setups. */
export async function createSetupFromForm(user: SessionUser | null, values: NewSetupValues, document: SetupDocument): Promise<CreateOutcome> {
	const problems = newSetupProblems(values);
	if (problems) return { ok: false, status: 400, errors: problems };
	const input = parseInput(setupCreateSchema, newSetupInput(values, document));
	const r = input.ok ? await attempt(() => createSetup(user, input.data)) : input;
	return r.ok ? { ok: true, id: r.data.id } : { ok: false, status: r.status, errors: newSetupErrors(r) };
}
