import { env } from '$env/dynamic/private';
import nodemailer, { type Transporter } from 'nodemailer';

let transport: Transporter | null = null;

/** SMTP through nodemailer: the local fake in development and tests, a real provider in production. */
export function mailer(): Transporter {
	if (!transport) {
		const server = env.EMAIL_SERVER;
		if (!server) throw new Error('EMAIL_SERVER is not set (see README, Configuration).');
		transport = nodemailer.createTransport(server);
	}
	return transport;
}

export function mailFrom(): string {
	return env.EMAIL_FROM || 'Squarelaw <no-reply@squarelaw.localhost>';
}

export interface Letter {
	to: string;
	subject: string;
	text: string;
	html: string;
}

export async function sendMail(letter: Letter): Promise<void> {
	await mailer().sendMail({ from: mailFrom(), ...letter });
}

export function escapeHtml(text: string): string {
	return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** Our plain letter layout: a few lines of text and one button-like link. */
export function letterHtml(paragraphs: string[], link: { href: string; label: string }, footer: string): string {
	const body = paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join('');
	return `<!doctype html><html><body style="font-family:'Work Sans',Arial,sans-serif;color:#171b1f;background:#f7f5f0;padding:24px">
<div style="max-width:480px;margin:0 auto;background:#ffffff;border:1px solid #c6ccd1;border-radius:8px;padding:24px">
<p style="margin:0 0 16px;font-weight:600;letter-spacing:0.04em">SQUARELAW</p>
${body}
<p style="margin:20px 0"><a href="${escapeHtml(link.href)}" style="display:inline-block;background:#252b31;color:#f7f5f0;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p>
<p style="margin:0;font-size:13px;color:#5a6570">${escapeHtml(footer)}</p>
</div></body></html>`;
}
