import { env } from '$env/dynamic/private';

export interface DevMessage {
	to: string;
	subject: string;
	text: string;
	html: string;
	receivedAt: string;
}

/** The local mail fake's mailbox, or null when the fake is off (always off in production). */
export async function readDevMailbox(): Promise<DevMessage[] | null> {
	const base = env.DEV_MAIL_URL;
	if (!base) return null;
	try {
		const res = await fetch(`${base}/messages`, { signal: AbortSignal.timeout(3000) });
		if (!res.ok) return null;
		return (await res.json()) as DevMessage[];
	} catch {
		return null;
	}
}
