import { devMailboxEnabled } from '$lib/server/dev-mail';

export function load() {
	return { devMailbox: devMailboxEnabled() };
}
