import { requireUser } from '$lib/server/authz';
import { bookingsCsv } from '$lib/server/workshops';

/** The roster's bookings, payments and refunds as a CSV download. */
export async function GET({ locals, params, url }) {
	const { filename, csv } = await bookingsCsv(requireUser(locals.user, url), params.id);
	return new Response(csv, {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${filename}"`, 'cache-control': 'no-store' }
	});
}
