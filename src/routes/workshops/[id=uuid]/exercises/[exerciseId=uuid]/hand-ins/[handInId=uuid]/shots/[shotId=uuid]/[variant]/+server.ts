import { error } from '@sveltejs/kit';
import { authorizeHandIn } from '$lib/server/authz';
import { shotImageFor } from '$lib/server/shots';

/** A handed-in shot's image, for whoever may read the hand-in (its student, the workshop's reviewers). */
export async function GET({ locals, params }) {
	const { handIn } = await authorizeHandIn(locals.user, params.handInId, 'read', { workshopId: params.id, exerciseId: params.exerciseId });
	if (!handIn.shotIds.includes(params.shotId)) error(404, 'No such shot in this hand-in.');
	const image = await shotImageFor(handIn.setupId, params.shotId, params.variant);
	return new Response(new Uint8Array(image.bytes), {
		headers: { 'content-type': image.contentType, 'cache-control': 'private, max-age=3600', 'x-content-type-options': 'nosniff' }
	});
}
