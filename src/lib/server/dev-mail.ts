import { env } from '$env/dynamic/private';

export interface DevMessage {
	to: string;
	subject: string;
	text: string;
	html: string;
	receivedAt: string;
}

export interface MailboxSettings {
	/** Where the app listens (`HOST`; adapter-node listens on every interface when it is unset). */
	host: string | undefined;
	/** The public address (`ORIGIN`). */
	origin: string | undefined;
	/** The mail fake's mailbox (`DEV_MAIL_URL`). */
	devMailUrl: string | undefined;
	/** Where mail is sent (`EMAIL_SERVER`). */
	emailServer: string | undefined;
}

/** 127.0.0.0/8, ::1 and localhost, bare or as a URL's hostname (`[::1]`). */
export function isLoopback(hostname: string): boolean {
	const h = hostname.toLowerCase().replace(/^\[(.*)\]$/, '$1');
	return h === 'localhost' || h === '::1' || /^127(\.\d{1,3}){3}$/.test(h);
}

function hostnameOf(url: string | undefined): string | null {
	try {
		return url ? new URL(url).hostname : null;
	} catch {
		return null;
	}
}

/**
 * Whether the local mailbox (`/api/dev/mail`, `/dev/mail`) may answer. It lists every sign-in and
 * invitation link, so it opens only where nobody but this machine can read it: the app listens on a
 * loopback address only, its public address is a loopback address too (a reverse proxy in front of a
 * loopback server would otherwise expose it), and mail goes to the local fake on this machine (the
 * same loopback host as the mailbox), never to a real mail server.
 */
export function devMailboxOpen({ host, origin, devMailUrl, emailServer }: MailboxSettings): boolean {
	const mailbox = hostnameOf(devMailUrl);
	const smtp = hostnameOf(emailServer);
	const originHost = hostnameOf(origin);
	return Boolean(
		host &&
			isLoopback(host) &&
			originHost &&
			isLoopback(originHost) &&
			mailbox &&
			isLoopback(mailbox) &&
			smtp === mailbox
	);
}

export function devMailboxEnabled(): boolean {
	return devMailboxOpen({ host: env.HOST, origin: env.ORIGIN, devMailUrl: env.DEV_MAIL_URL, emailServer: env.EMAIL_SERVER });
}

/** The local mail fake's mailbox, or null when it is closed (always in production) or the fake is off. */
export async function readDevMailbox(): Promise<DevMessage[] | null> {
	if (!devMailboxEnabled()) return null;
	try {
		const res = await fetch(`${env.DEV_MAIL_URL}/messages`, { signal: AbortSignal.timeout(3000) });
		if (!res.ok) return null;
		return (await res.json()) as DevMessage[];
	} catch {
		return null;
	}
}
