import { fail } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { displayNameSchema, fieldErrors, newTokenSchema } from '$lib/schemas/account';
import { signOut } from '../../auth';
import { renameUser, saveUnitPreference } from '$lib/server/db/queries/users';
import { createAccessToken, listAccessTokens, revokeAccessToken } from '$lib/server/db/queries/tokens';
import { sessionMaxAgeMs } from '$lib/server/hashed-sessions';
import { deleteSessionsOfUser } from '$lib/server/db/queries/sessions';
import { myStudios } from '$lib/server/studios';
import { isUnitSystem, rememberUnitSystem } from '$lib/server/unit-preference';

export async function load({ locals, url }) {
	const user = requireUser(locals.user, url);
	return {
		account: user,
		loadedAt: Date.now(),
		sessionMaxDays: Math.round((sessionMaxAgeMs() / (24 * 3600_000)) * 10) / 10,
		tokens: await listAccessTokens(user.id),
		studios: await myStudios(user)
	};
}

export const actions = {
	rename: async ({ locals, request, url }) => {
		const user = requireUser(locals.user, url);
		const parsed = displayNameSchema.safeParse((await request.formData()).get('name') ?? '');
		if (!parsed.success) return fail(400, { action: 'rename', errors: { name: parsed.error.issues[0].message } });
		await renameUser(user.id, parsed.data);
		return { action: 'rename', saved: true };
	},
	units: async ({ locals, request, cookies, url }) => {
		const user = requireUser(locals.user, url);
		const value = (await request.formData()).get('unitSystem');
		if (!isUnitSystem(value)) {
			return fail(400, { action: 'units', errors: { unitSystem: 'Choose metric or imperial.' } });
		}
		await saveUnitPreference(user.id, value);
		rememberUnitSystem(cookies, value);
		return { action: 'units', saved: true };
	},
	createToken: async ({ locals, request, url }) => {
		const user = requireUser(locals.user, url);
		const parsed = newTokenSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { action: 'createToken', errors: fieldErrors(parsed.error) });
		const { tokenName, scope, expiresInDays } = parsed.data;
		const expiresAt = expiresInDays === 'never' ? null : new Date(Date.now() + Number(expiresInDays) * 24 * 3600_000);
		const token = await createAccessToken(user.id, tokenName, { scope, expiresAt });
		return {
			action: 'createToken',
			newToken: { name: token.name, secret: token.secret, scope: token.scope, expiresAt: token.expiresAt }
		};
	},
	revokeToken: async ({ locals, request, url }) => {
		const user = requireUser(locals.user, url);
		const id = String((await request.formData()).get('tokenId') ?? '');
		const done = /^[0-9a-f-]{36}$/i.test(id) && (await revokeAccessToken(user.id, id));
		if (!done) return fail(400, { action: 'revokeToken', errors: { tokenId: 'That token is already revoked or is not yours.' } });
		return { action: 'revokeToken', revoked: true };
	},
	/**
	 * Ends every session of this account, this browser's included (Auth.js then clears the cookie and sends
	 * the browser to `redirectTo`, the signed-out page). Access tokens are not sessions and stay.
	 */
	signOutEverywhere: async (event) => {
		const user = requireUser(event.locals.user, event.url);
		await deleteSessionsOfUser(user.id);
		await signOut(event);
	}
};
