// What the notebook keeps true of a setup's documents: stored documents are read through the migrations,
// gear used by a plan is copied into the document on save, and the errors a save can end in.
import { RuleViolation } from '$lib/server/errors';
import { gearRowsByIds } from '$lib/server/db/queries/gear';
import { elementUsingGear, referencedGearIds, withGearCalibrations, type GearSnapshot, type SetupDocument } from '$lib/scene/document';
import { migrateDocument, type DocumentIssue } from '$lib/scene/migrations';
import { MAX_DOCUMENT_DEPTH, trimJson } from '$lib/json-limits';
import type { Conflict } from '$lib/notebook/save';

/**
 * A save on a revision that is no longer the latest: 409 with `latestRevision` and, when it could be
 * worked out, `conflict`: what the saves since the base changed, all a page needs to show it.
 */
export class StaleRevisionError extends RuleViolation {
	readonly extra: { latestRevision: number; conflict?: Conflict };
	constructor(
		readonly latestRevision: number,
		readonly conflict: Conflict | null = null
	) {
		super(
			`This setup has changed since the revision you started from: revision ${latestRevision} is the latest. Reload it, then save again.`,
			'baseRevision',
			409
		);
		this.extra = conflict ? { latestRevision, conflict } : { latestRevision };
	}
}

/** Bad input found below the edge (a gear id the shelf does not know, an import file): 400 with issues. */
export class InputError extends RuleViolation {
	constructor(message: string, issues: DocumentIssue[]) {
		super(message, issues[0]?.path.join('.') || null, 400, issues);
	}
}

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

export function searchTextOf(title: string, subject: string, tags: string[], document: SetupDocument) {
	return [title, subject, ...tags, ...document.gear.map((g) => g.name)].join(' ').toLowerCase();
}

/**
 * Fills `document.gear` with a copy of every gear item the plan refers to. A copy already in the base
 * revision is carried forward unchanged (unless the gear id is in `refresh`); gear newly attached is
 * copied from the studio's shelf now; gear that is not on this studio's shelf keeps the copy that came
 * with the document (an imported or duplicated setup). Copies no element refers to are dropped.
 * A flash's copy always takes the calibration in force on the shelf now (its `calibrationOffsetStops`),
 * and the scene's lights drawn from it carry that offset: saves from then on predict with it, while
 * revisions saved before keep theirs.
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
	const calibrated = gear.map((g) => {
		const onShelf = shelf.get(g.id);
		return g.kind === 'flash' && onShelf ? { ...g, spec: { ...g.spec, calibrationOffsetStops: onShelf.spec.calibrationOffsetStops ?? 0 } } : g;
	});
	return withGearCalibrations({ ...document, gear: calibrated });
}
