import { fail } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { runAction } from '$lib/server/actions';
import {
	answerJoinRequest,
	cancelBookingWithRefund,
	inviteToWorkshop,
	removeFromWorkshop,
	revokeWorkshopInvitation,
	workshopBookings,
	workshopRoster
} from '$lib/server/workshops';
import { text } from '$lib/server/workshops/forms';
import { mergeAddressLists, parseAddressCsv, parseAddressText } from '$lib/workshops/addresses';

/** The largest CSV file of addresses taken (a few thousand lines). */
const MAX_CSV_BYTES = 256 * 1024;

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const bookings = await workshopBookings(user, params.id);
	const { access, ...roster } = await workshopRoster(user, params.id);
	return {
		...roster,
		bookings,
		workshop: { id: access.workshop.id, title: access.workshop.title, capacity: access.workshop.capacity, priceMinor: access.workshop.priceMinor },
		canManage: access.can['workshop.manage']
	};
}

export const actions = {
	invite: async ({ locals, params, request, url, getClientAddress }) => {
		const form = await request.formData();
		const pasted = text(form, 'emails');
		const file = form.get('csv');
		let fromFile = { valid: [] as string[], invalid: [] as { entry: string; message: string }[] };
		if (file instanceof File && file.size > 0) {
			if (file.size > MAX_CSV_BYTES) {
				return fail(400, { action: 'invite', errors: { csv: `The file is too large: at most ${MAX_CSV_BYTES / 1024} KB of addresses.` }, values: { emails: pasted } });
			}
			fromFile = parseAddressCsv(await file.text());
		}
		const role = text(form, 'role') === 'instructor' ? 'instructor' : 'student';
		const addresses = mergeAddressLists(parseAddressText(pasted), fromFile);
		return runAction('invite', async () => {
			const report = await inviteToWorkshop(locals.user, params.id, { addresses, role }, { origin: url.origin, ip: getClientAddress() });
			return { action: 'invite', report };
		});
	},
	revoke: async ({ locals, params, request }) => {
		const id = text(await request.formData(), 'invitationId');
		return runAction('revoke', async () => {
			await revokeWorkshopInvitation(locals.user, params.id, id);
			return { action: 'revoke', done: true };
		});
	},
	remove: async ({ locals, params, request }) => {
		const id = text(await request.formData(), 'memberId');
		return runAction('remove', async () => {
			await removeFromWorkshop(locals.user, params.id, id);
			return { action: 'remove', done: true };
		});
	},
	cancelBooking: async ({ locals, params, request }) => {
		const id = text(await request.formData(), 'bookingId');
		return runAction('cancelBooking', async () => {
			const { refunded } = await cancelBookingWithRefund(locals.user, params.id, id);
			return { action: 'cancelBooking', done: true, refunded };
		});
	},
	answer: async ({ locals, params, request }) => {
		const form = await request.formData();
		const decision = text(form, 'decision') === 'accepted' ? 'accepted' : 'declined';
		return runAction('answer', async () => {
			await answerJoinRequest(locals.user, params.id, text(form, 'requestId'), decision);
			return { action: 'answer', done: true, decision };
		});
	}
};
