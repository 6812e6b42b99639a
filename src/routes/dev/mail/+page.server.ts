import { error } from '@sveltejs/kit';
import { readDevMailbox } from '$lib/server/dev-mail';

export async function load() {
	const messages = await readDevMailbox();
	if (!messages) error(404, 'The local mailbox only exists while the local mail fake runs (development and tests).');
	return { messages };
}
