import { fail } from '@sveltejs/kit';
import { RuleViolation } from '$lib/server/errors';

/**
 * Runs a form action's work and turns a broken rule into `fail()` with the message beside its field.
 * A refusal from authz (401/403/404) is left to SvelteKit, which answers with that status.
 */
export async function runAction<T>(action: string, work: () => Promise<T>) {
	try {
		return await work();
	} catch (e) {
		if (e instanceof RuleViolation) {
			return fail(e.status, { action, errors: { [e.field ?? 'form']: e.message } as Record<string, string> });
		}
		throw e;
	}
}
