import { redirect } from '@sveltejs/kit';
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
	/** "Book a seat": a seat is held and the buyer sent to the hosted checkout (a plain form post, so the browser follows). */
	book: async ({ locals, params, url }) => {
		requireUser(locals.user, url);
		const result = await runAction('book', () => bookSeat(locals.user, params.slug, { origin: url.origin }));
		if (result && 'checkoutUrl' in result) redirect(303, result.checkoutUrl);
		return result;
	}
};
