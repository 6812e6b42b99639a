import { z } from 'zod';

export const emailSchema = z
	.string({ error: 'Enter an e-mail address.' })
	.trim()
	.toLowerCase()
	.max(254, 'That e-mail address is too long.')
	.pipe(z.email({ error: 'That is not an e-mail address (it should look like name@example.org).' }));

export const studioNameSchema = z
	.string({ error: 'Give the studio a name.' })
	.trim()
	.min(1, 'Give the studio a name.')
	.max(80, 'A studio name has at most 80 characters.');

export const studioRoleSchema = z.enum(['owner', 'editor', 'viewer'], {
	error: 'The role must be owner, editor or viewer.'
});

export const inviteSchema = z.object({ email: emailSchema, role: studioRoleSchema });

export const displayNameSchema = z
	.string()
	.trim()
	.min(1, 'Enter a name.')
	.max(80, 'A name has at most 80 characters.');

export const tokenNameSchema = z
	.string()
	.trim()
	.min(1, 'Name the token so you can tell it apart later.')
	.max(60, 'A token name has at most 60 characters.');

export const tokenScopeSchema = z.enum(['read-only', 'read-write'], { error: 'Choose read-only or read-write.' });

/** How long a new token lasts, in days, or `never`. */
export const TOKEN_LIFETIMES = ['7', '30', '90', '365', 'never'] as const;

export const newTokenSchema = z.object({
	tokenName: tokenNameSchema,
	scope: tokenScopeSchema,
	expiresInDays: z.enum(TOKEN_LIFETIMES, { error: 'Choose when the token expires.' })
});

/** zod issues as `{ field: message }`, the shape forms show beside each field. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.map(String).join('.') || 'form';
		out[key] ??= issue.message;
	}
	return out;
}
