import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http';
import { readDevMailbox } from '$lib/server/dev-mail';

export async function GET() {
	const messages = await readDevMailbox();
	if (!messages) return apiError(404, 'The local mail fake is not running.');
	return json(messages);
}
