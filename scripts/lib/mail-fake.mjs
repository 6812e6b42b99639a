// The local mail fake: an SMTP server on loopback that keeps what it receives in memory, and a tiny
// HTTP endpoint on loopback that the app's development-only /api/dev/mail reads. Never used in production.
import http from 'node:http';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const MAX_MESSAGES = 500;

export async function startMailFake({ smtpPort, httpPort, host = '127.0.0.1' }) {
	/** @type {{ to: string, subject: string, text: string, html: string, receivedAt: string }[]} */
	const messages = [];

	const smtp = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS', 'AUTH'],
		logger: false,
		size: 2 * 1024 * 1024,
		onData(stream, session, callback) {
			simpleParser(stream)
				.then((mail) => {
					const to = session.envelope.rcptTo.map((r) => r.address).join(', ');
					messages.unshift({
						to,
						subject: mail.subject ?? '',
						text: mail.text ?? '',
						html: typeof mail.html === 'string' ? mail.html : '',
						receivedAt: new Date().toISOString()
					});
					messages.length = Math.min(messages.length, MAX_MESSAGES);
					callback();
				})
				.catch(callback);
		}
	});

	const web = http.createServer((req, res) => {
		if (req.url === '/messages' && req.method === 'GET') {
			res.writeHead(200, { 'content-type': 'application/json' });
			res.end(JSON.stringify(messages));
		} else if (req.url === '/messages' && req.method === 'DELETE') {
			messages.length = 0;
			res.writeHead(204).end();
		} else {
			res.writeHead(404).end();
		}
	});

	await new Promise((resolve, reject) => {
		smtp.once('error', reject);
		smtp.listen(smtpPort, host, resolve);
	});
	await new Promise((resolve, reject) => {
		web.once('error', reject);
		web.listen(httpPort, host, resolve);
	});

	return {
		smtpUrl: `smtp://${host}:${smtpPort}`,
		httpUrl: `http://${host}:${httpPort}`,
		async stop() {
			await new Promise((r) => smtp.close(r));
			await new Promise((r) => web.close(r));
		}
	};
}
