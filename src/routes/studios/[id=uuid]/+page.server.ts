import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { inviteSchema, studioNameSchema, studioRoleSchema } from '$lib/schemas/account';
import { runAction } from '$lib/server/actions';
import {
	changeMemberRole,
	deleteStudio,
	inviteToStudio,
	leaveStudio,
	removeMember,
	renameStudio,
	revokeInvitation,
	studioOverview
} from '$lib/server/studios';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const overview = await studioOverview(user, params.id);
	return { ...overview, me: user.id };
}

export const actions = {
	rename: async ({ locals, params, request }) => {
		const parsed = studioNameSchema.safeParse((await request.formData()).get('name') ?? '');
		if (!parsed.success) return fail(400, { action: 'rename', errors: { name: parsed.error.issues[0].message } });
		return runAction('rename', async () => {
			await renameStudio(locals.user, params.id, parsed.data);
			return { action: 'rename', saved: true };
		});
	},
	invite: async ({ locals, params, request, url, getClientAddress }) => {
		const form = await request.formData();
		const parsed = inviteSchema.safeParse({ email: form.get('email') ?? '', role: form.get('role') ?? '' });
		if (!parsed.success) {
			const errors: Record<string, string> = {};
			for (const issue of parsed.error.issues) errors[String(issue.path[0])] ??= issue.message;
			return fail(400, { action: 'invite', errors, email: String(form.get('email') ?? '') });
		}
		return runAction('invite', async () => {
			await inviteToStudio(locals.user, params.id, parsed.data, { origin: url.origin, ip: getClientAddress() });
			return { action: 'invite', invited: parsed.data.email };
		});
	},
	revokeInvitation: async ({ locals, params, request }) => {
		const id = String((await request.formData()).get('invitationId') ?? '');
		return runAction('revokeInvitation', async () => {
			await revokeInvitation(locals.user, params.id, id);
			return { action: 'revokeInvitation', done: true };
		});
	},
	changeRole: async ({ locals, params, request }) => {
		const form = await request.formData();
		const role = studioRoleSchema.safeParse(form.get('role'));
		if (!role.success) return fail(400, { action: 'changeRole', errors: { role: role.error.issues[0].message } });
		return runAction('changeRole', async () => {
			await changeMemberRole(locals.user, params.id, String(form.get('membershipId') ?? ''), role.data);
			return { action: 'changeRole', done: true };
		});
	},
	removeMember: async ({ locals, params, request }) => {
		const id = String((await request.formData()).get('membershipId') ?? '');
		return runAction('removeMember', async () => {
			await removeMember(locals.user, params.id, id);
			return { action: 'removeMember', done: true };
		});
	},
	leave: async ({ locals, params }) => {
		const result = await runAction('leave', () => leaveStudio(locals.user, params.id));
		if (result && typeof result === 'object' && 'status' in result) return result;
		redirect(303, '/studios');
	},
	delete: async ({ locals, params, request }) => {
		const confirm = String((await request.formData()).get('confirm') ?? '');
		if (confirm !== 'delete') {
			return fail(400, { action: 'delete', errors: { confirm: 'Type “delete” to confirm.' } });
		}
		const result = await runAction('delete', () => deleteStudio(locals.user, params.id));
		if (result && typeof result === 'object' && 'status' in result) return result;
		redirect(303, '/studios');
	}
};
