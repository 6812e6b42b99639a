import { redirect } from '@sveltejs/kit';
import { signOut } from '../../auth';

export function load() {
	redirect(303, '/');
}

export const actions = { default: signOut };
