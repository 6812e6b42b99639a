import { requireUser } from '$lib/server/authz';
import { runAction } from '$lib/server/actions';
import { askToJoin, bookSeat, publicWorkshop } from '$lib/server/workshops';
import { formAction, text } from '$lib/server/workshops/forms';
import { joinRequestSchema } from '$lib/workshops/inputs';

/** The public page of a published workshop: anyone may read it, signed in or not. */
export async function load({ locals, params }) {
	return { workshop: await publicWorkshop(locals.user, params.slug), signedIn: Boolean(locals.user) };
}

export const actions = {
	ask: async ({ locals, params, request, url }) => {
		requireUser(locals.user, url);
		const raw = { message: text(await request.formData(), 'message') };
		return formAction('ask', joinRequestSchema, raw, async (input) => {
			await askToJoin(locals.user, params.slug, input.message);
			return { action: 'ask', asked: true };
		}, raw);
	},
	/**
	 * "Book a seat": a seat is held and the checkout's address handed back. The page sends the browser
	 * there by script (the content security policy keeps form posts, and their redirects, on this site);
	 * without JavaScript it shows a link to it.
	 */
	book: async ({ locals, params, url }) => {
		requireUser(locals.user, url);
		return runAction('book', async () => ({ action: 'book', ...(await bookSeat(locals.user, params.slug, { origin: url.origin })) }));
	}
};
