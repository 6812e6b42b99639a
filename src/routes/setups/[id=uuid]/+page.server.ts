import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { setupOverview, trashSetup } from '$lib/server/setups';
import { saveChange, type SaveOutcome } from '$lib/server/setups-changes';
import { shelfOf } from '$lib/server/gear';
import { exerciseForSetup } from '$lib/server/exercises';
import { elementLabels } from '$lib/notebook/load';
import { modelFromDocument } from '$lib/editor/model/document';
import { renderNotes } from '$lib/notebook/markdown';
import { CAMERA_FIELDS, parseCameraSettings, parseTags } from '$lib/notebook/settings';

export async function load({ params, url, locals }) {
	const user = requireUser(locals.user, url);
	const { setup, latest, exposure, exposureError, access } = await setupOverview(user, params.id);
	// The studio's gear (modifiers, flashes, cameras, lenses), offered in the editor: only what the editor reads.
	const shelf = (await shelfOf(access)).map(({ id, kind, name, spec }) => ({ id, kind, name, spec }));
	return {
		setup: {
			id: setup.id,
			title: setup.title,
			subject: setup.subject,
			tags: setup.tags,
			studioId: setup.studioId,
			studioName: setup.studioName,
			revisionNumber: setup.revisionNumber,
			thumbnailRevision: setup.thumbnailRevision,
			derivatives: setup.derivatives
		},
		document: setup.document,
		// The plan read into the editor's model here, with the element schemas: the page starts its editor
		// from it, so the browser's first load carries no zod.
		editorModel: modelFromDocument(setup.document),
		documentTrimmed: (setup.documentTrimmed as string[][] | undefined) ?? [],
		labels: elementLabels(setup.document),
		notesHtml: renderNotes(setup.document.notes ?? ''),
		exposure,
		exposureError,
		latest,
		// Revisions are numbered from 1 and never removed.
		revisionCount: setup.revisionNumber,
		// The origin's title only for a caller who may see the origin.
		origin: setup.derivedFrom ? { ...setup.derivedFrom, title: setup.derivedFrom.title ?? null } : null,
		canEdit: setup.canEdit,
		canDuplicate: setup.canDuplicate,
		unitSystem: user.unitSystem,
		shelf,
		// The exercise this setup is the caller's copy of: its brief and targets beside the editor.
		exercise: await exerciseForSetup(user, params.id)
	};
}

function baseRevisionOf(form: FormData): number | null {
	const n = Number(form.get('baseRevision'));
	return Number.isInteger(n) && n >= 1 ? n : null;
}

/** Turns a save's outcome into the page's answer for the form named `action`. */
function answer(action: string, outcome: SaveOutcome, values: Record<string, string>, fields: readonly string[], pathToField: (path: string[]) => string | null) {
	if (outcome.kind === 'saved') return { action, saved: outcome.revisionNumber };
	if (outcome.kind === 'conflict') return fail(409, { action, values, conflict: outcome.conflict, errors: {} as Record<string, string> });
	if (outcome.status === 401 || outcome.status === 403 || outcome.status === 404) error(outcome.status, outcome.message);
	const errors: Record<string, string> = {};
	for (const issue of outcome.issues) {
		const field = pathToField(issue.path);
		const key = field && fields.includes(field) ? field : 'form';
		if (!(key in errors)) errors[key] = key === 'form' && issue.path.length ? `${issue.path.join('.')}: ${issue.message}` : issue.message;
	}
	if (!Object.keys(errors).length) errors.form = outcome.message;
	return fail(outcome.status === 400 ? 400 : outcome.status, { action, values, errors });
}

export const actions = {
	/** Notes: a new revision with the notes replaced, on top of the revision the form started from. */
	notes: async ({ request, params, locals }) => {
		const form = await request.formData();
		const notes = String(form.get('notes') ?? '').replace(/\r\n/g, '\n');
		const message = String(form.get('message') ?? '').trim();
		const values = { notes, message };
		const base = baseRevisionOf(form);
		if (base === null) return fail(400, { action: 'notes', values, errors: { form: 'The form lost its revision number; reload the page.' } as Record<string, string> });
		const outcome = await saveChange(locals.user, {
			setupId: params.id,
			baseRevision: base,
			apply: (doc) => ({ ...doc, notes }),
			message: message || 'Notes changed'
		});
		return answer('notes', outcome, values, ['notes', 'message'], (path) => (path.at(-1) === 'notes' ? 'notes' : path[0] === 'message' ? 'message' : null));
	},

	/** Camera settings: ISO, aperture, shutter speed and magnification. */
	settings: async ({ request, params, locals }) => {
		const form = await request.formData();
		const values = Object.fromEntries(CAMERA_FIELDS.map((f) => [f, String(form.get(f) ?? '')])) as Record<(typeof CAMERA_FIELDS)[number], string>;
		const base = baseRevisionOf(form);
		if (base === null) return fail(400, { action: 'settings', values, errors: { form: 'The form lost its revision number; reload the page.' } as Record<string, string> });
		const parsed = parseCameraSettings(values);
		if (!parsed.ok) return fail(400, { action: 'settings', values, errors: parsed.errors as Record<string, string> });
		const outcome = await saveChange(locals.user, {
			setupId: params.id,
			baseRevision: base,
			apply: (doc) => ({ ...doc, scene: { ...doc.scene, camera: { ...doc.scene.camera, ...parsed.value } } }),
			message: 'Camera settings changed'
		});
		return answer('settings', outcome, values, CAMERA_FIELDS, (path) => (path.includes('camera') ? (path.at(-1) ?? null) : null));
	},

	/** Title, subject and tags (saved as a revision too, so the history shows the rename). */
	details: async ({ request, params, locals }) => {
		const form = await request.formData();
		const values = { title: String(form.get('title') ?? ''), subject: String(form.get('subject') ?? ''), tags: String(form.get('tags') ?? '') };
		const base = baseRevisionOf(form);
		if (base === null) return fail(400, { action: 'details', values, errors: { form: 'The form lost its revision number; reload the page.' } as Record<string, string> });
		if (!values.title.trim()) return fail(400, { action: 'details', values, errors: { title: 'Title must not be empty.' } as Record<string, string> });
		const outcome = await saveChange(locals.user, {
			setupId: params.id,
			baseRevision: base,
			apply: (doc) => doc,
			title: values.title.trim(),
			subject: values.subject.trim(),
			tags: parseTags(values.tags),
			message: 'Title, subject or tags changed'
		});
		return answer('details', outcome, values, ['title', 'subject', 'tags'], (path) => path[0] ?? null);
	},

	/** To the trash: every revision is kept and the setup can be restored from the trash. */
	delete: async ({ params, locals, request }) => {
		const form = await request.formData();
		const title = String(form.get('title') ?? 'The setup');
		await trashSetup(locals.user, params.id);
		redirect(303, `/setups?deleted=${encodeURIComponent(title)}`);
	}
};
