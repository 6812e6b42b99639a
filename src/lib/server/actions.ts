import { fail, isHttpError } from '@sveltejs/kit';
import type { z } from 'zod';
import { RuleViolation } from '$lib/server/errors';
import { invalidInputMessage, zodIssues } from '$lib/server/http';

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

export interface ServiceFailure {
	ok: false;
	status: number;
	message: string;
	/** The fields at fault, by their path in the service's input. */
	issues: { path: string[]; message: string }[];
}

export type ServiceResult<T> = { ok: true; data: T } | ServiceFailure;

/**
 * A form's input checked with the JSON route's own schema: the failure the route would answer (400,
 * the fields at fault), so a page can put each message beside its input.
 */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown): ServiceResult<z.output<S>> {
	const parsed = schema.safeParse(input);
	if (parsed.success) return { ok: true, data: parsed.data };
	const issues = zodIssues(parsed.error);
	return { ok: false, status: 400, message: invalidInputMessage(issues), issues };
}

/**
 * Runs a service for a form action. A refusal (authz's 401, 403, 404) or a broken rule comes back as
 * the JSON route would answer it (status, message, issues), for pages whose forms show them beside a
 * field rather than as an error page. A redirect and anything unexpected are thrown on.
 */
export async function attempt<T>(work: () => Promise<T>): Promise<ServiceResult<T>> {
	try {
		return { ok: true, data: await work() };
	} catch (e) {
		if (isHttpError(e)) return { ok: false, status: e.status, message: e.body.message, issues: [] };
		if (e instanceof RuleViolation) return { ok: false, status: e.status, message: e.message, issues: e.issues };
		throw e;
	}
}
