import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http';
import { readDevMailbox } from '$lib/server/dev-mail';

export async function GET() {
	const messages = await readDevMailbox();
	if (!messages) return apiError(404, 'The local mailbox is closed: it answers only on a loopback-only development server that sends mail to the local mail fake.');
	return json(messages);
}
