import { error, fail, redirect } from '@sveltejs/kit';
import { authorizeSetup, requireUser } from '$lib/server/authz';
import { myStudios } from '$lib/server/studios';
import { duplicateSetup } from '$lib/server/setups';
import { attempt, parseInput } from '$lib/server/actions';
import { issuesByField } from '$lib/notebook/api';
import { setupDuplicateSchema } from '$lib/scene/inputs';

/** Studios where the caller may make setups: only those are offered as the copy's home. */
async function editableStudios(user: Parameters<typeof myStudios>[0]) {
	const studios = await myStudios(user);
	return studios.filter((s) => s.role === 'owner' || s.role === 'editor').map((s) => ({ id: s.id, name: s.name, personal: s.personal }));
}

export async function load({ params, url, locals }) {
	const user = requireUser(locals.user, url);
	const { setup, canDuplicate } = await authorizeSetup(user, params.id, 'setups.view');
	if (!canDuplicate) error(403, 'Your role in this studio does not allow duplicating its setups.');
	const studios = await editableStudios(user);
	// The copy stays beside the original when the caller may edit there; else it goes to their own studio.
	const here = studios.find((s) => s.id === setup.studioId);
	const defaultStudioId = here?.id ?? studios.find((s) => s.personal)?.id ?? studios[0]?.id ?? '';
	return {
		setup: { id: setup.id, title: setup.title, subject: setup.subject, revisionNumber: setup.latestRevision, tags: setup.tags },
		studios,
		defaultStudioId
	};
}

export const actions = {
	default: async ({ request, params, locals }) => {
		const form = await request.formData();
		const values = {
			subject: String(form.get('subject') ?? '').trim(),
			title: String(form.get('title') ?? '').trim(),
			studioId: String(form.get('studioId') ?? '')
		};
		const errors: Record<string, string> = {};
		if (!values.subject) errors.subject = 'Name the new subject: the copy is for it.';
		if (!values.title) errors.title = 'Give the copy a title.';
		if (!values.studioId) errors.studioId = 'Choose the studio the copy goes to.';
		if (Object.keys(errors).length) return fail(400, { values, errors });
		const input = parseInput(setupDuplicateSchema, values);
		const r = input.ok ? await attempt(() => duplicateSetup(locals.user, params.id, input.data)) : input;
		if (!r.ok) {
			if (r.status === 401) error(401, r.message);
			// A studio the caller may not edit in answers 403/404: say so beside the studio field.
			if (r.status === 403 || (r.status === 404 && r.message.toLowerCase().includes('studio'))) {
				return fail(403, { values, errors: { studioId: `You cannot add setups to that studio (${r.message})` } as Record<string, string> });
			}
			if (r.status === 404) error(404, r.message);
			const fieldErrors = issuesByField(r.issues, ['subject', 'title', 'studioId']);
			if (!Object.keys(fieldErrors).length) fieldErrors.form = r.message;
			return fail(r.status, { values, errors: fieldErrors });
		}
		redirect(303, `/setups/${r.data.id}?duplicated=1`);
	}
};
