import { env } from '$env/dynamic/private';

export function load() {
	return { devMailbox: Boolean(env.DEV_MAIL_URL) };
}
