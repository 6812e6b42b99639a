import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { myStudios } from '$lib/server/studios';
import { listGear } from '$lib/server/gear';
import { blankDocument } from '$lib/notebook/load';
import { readNewSetupForm } from '$lib/notebook/create';
import { createSetupFromForm } from '$lib/server/setups-changes';

/** A new setup in the editor: the empty plan, and the studios the user may add setups to. */
export async function load({ locals, url }) {
	const user = requireUser(locals.user, url);
	const studios = (await myStudios(user)).filter((s) => s.role === 'owner' || s.role === 'editor');
	// Each studio's modifiers, so the editor offers the shelf of the studio the setup will go to.
	const shelves = await Promise.all(studios.map((s) => listGear(user, { studioId: s.id }).catch(() => ({ items: [] }))));
	return {
		studios: studios.map((s) => ({ id: s.id, name: s.name, personal: s.personal })),
		shelfByStudio: Object.fromEntries(studios.map((s, i) => [s.id, shelves[i].items])),
		document: blankDocument(),
		// The notebook's small form can open the editor with what was typed there.
		values: { title: url.searchParams.get('title') ?? '', subject: url.searchParams.get('subject') ?? '', studioId: url.searchParams.get('studioId') ?? '' },
		unitSystem: user.unitSystem
	};
}

export const actions = {
	/** Without JavaScript: the setup is made with the empty plan; the editor then opens on it. */
	create: async ({ request, locals }) => {
		const values = readNewSetupForm(await request.formData());
		const r = await createSetupFromForm(locals.user, values, blankDocument());
		if (!r.ok) return fail(r.status, { values, errors: r.errors });
		redirect(303, `/setups/${r.id}?created=1`);
	}
};
