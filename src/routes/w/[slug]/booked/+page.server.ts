import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { cancelCheckout, returnFromCheckout } from '$lib/server/workshops';

/**
 * Where the hosted checkout sends the buyer back: paid (confirmed by the webhook, or settled here when
 * the webhook is late) lands on the workshop as a student; cancelled gives the seat back at once.
 */
export async function load({ locals, url, params }) {
	const user = requireUser(locals.user, url);
	const bookingId = url.searchParams.get('booking') ?? '';
	const booking = url.searchParams.has('cancelled') ? await cancelCheckout(user, bookingId) : await returnFromCheckout(user, bookingId);
	if (booking.state === 'confirmed') redirect(303, `/workshops/${booking.workshopId}?booked`);
	return { booking, slug: params.slug, cancelled: url.searchParams.has('cancelled') };
}
