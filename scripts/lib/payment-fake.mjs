// The local payment fake: the few calls of the payment provider's API that Squarelaw makes (hosted
// checkout sessions, expiring one, refunds), a plain test payment page with "Pay" and "Cancel", and the
// webhook events the app listens to, signed the provider's way with the official SDK's own test helper.
// It keeps everything in memory, on loopback, for `npm start`, `npm test` and the bench. Never used in
// production (README, "Past one machine"). No maintained package fakes hosted checkout with signed
// webhooks, so this is the smallest one that does.
//
// Beside the API, a few routes for tests and the bench (on loopback only, like the mail fake's list):
//   GET  /_fake/state                  sessions, payments and refunds
//   POST /_fake/sessions/<id>/pay      pays a session as the payment page's button does (JSON answer)
//   POST /_fake/events/<id>/resend     sends an event again, byte for byte, freshly signed
//   POST /_fake/outage?ms=…            stops answering for that long (connections refused), then returns
import http from 'node:http';
import { randomBytes } from 'node:crypto';
import Stripe from 'stripe';

const id = (prefix) => `${prefix}_test_${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);

/** A form body as the SDK encodes it (`line_items[0][price_data][currency]=eur`) as nested objects. */
export function decodeForm(body) {
	const out = {};
	for (const [key, value] of new URLSearchParams(body)) {
		const path = key.split(/\[|\]\[|\]/).filter((p) => p !== '');
		let node = out;
		for (const [i, part] of path.entries()) {
			if (i === path.length - 1) node[part] = value;
			else node = node[part] ??= {};
		}
	}
	return out;
}

function escapeHtml(text) {
	return String(text).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]);
}

function readBody(req) {
	return new Promise((resolve, reject) => {
		let body = '';
		req.setEncoding('utf8');
		req.on('data', (c) => (body += c));
		req.on('end', () => resolve(body));
		req.on('error', reject);
	});
}

function apiError(res, status, message, code = 'resource_missing') {
	res.writeHead(status, { 'content-type': 'application/json' });
	res.end(JSON.stringify({ error: { type: 'invalid_request_error', code, message } }));
}

function sendJson(res, status, value) {
	res.writeHead(status, { 'content-type': 'application/json' });
	res.end(JSON.stringify(value));
}

function money(amount, currency) {
	const zeroDecimal = ['jpy', 'krw'].includes(currency);
	return `${(zeroDecimal ? amount : amount / 100).toFixed(zeroDecimal ? 0 : 2)} ${currency.toUpperCase()}`;
}

function paymentPage(session) {
	const open = session.status === 'open' && session.expires_at > now();
	const state = session.payment_status === 'paid' ? 'This session is paid.' : open ? '' : 'This session has expired.';
	return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Test payment</title><style>body{font-family:sans-serif;max-width:28rem;margin:3rem auto;padding:0 1rem;color:#171b1f}
button{font:inherit;padding:.5rem 1rem;margin-right:.5rem}</style></head><body>
<h1>Test payment</h1>
<p>Local payment fake: no money moves.</p>
<p><strong>${escapeHtml(session.line_name)}</strong></p>
<p>Amount: <strong data-testid="fake-amount">${escapeHtml(money(session.amount_total, session.currency))}</strong></p>
${session.customer_email ? `<p>For ${escapeHtml(session.customer_email)}</p>` : ''}
${state ? `<p role="status">${escapeHtml(state)}</p>` : ''}
<form method="post" action="/pay/${session.id}/pay" style="display:inline"><button type="submit"${open ? '' : ' disabled'}>Pay</button></form>
<form method="post" action="/pay/${session.id}/cancel" style="display:inline"><button type="submit">Cancel</button></form>
</body></html>`;
}

/**
 * @param {{ port: number, host?: string, webhookUrl: string, webhookSecret: string }} options
 */
export async function startPaymentFake({ port, host = '127.0.0.1', webhookUrl, webhookSecret }) {
	const sdk = new Stripe('sk_test_fake');
	/** @type {Map<string, any>} */
	const sessions = new Map();
	/** Payment intents (one per paid session) with what was refunded of each. */
	const payments = new Map();
	const refunds = new Map();
	const events = new Map();
	/** Idempotency keys: the answer given the first time, as the provider keeps it. */
	const idempotent = new Map();
	const deliveries = [];

	function publicSession(s) {
		const { line_name: _name, ...rest } = s;
		return rest;
	}

	/** Signs and posts an event to the app; a few tries, as the provider retries (it keeps retrying for days). */
	async function deliver(event) {
		const payload = JSON.stringify(event);
		for (let attempt = 0; attempt < 3; attempt++) {
			const header = sdk.webhooks.generateTestHeaderString({ payload, secret: webhookSecret });
			try {
				const res = await fetch(webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: payload });
				deliveries.push({ event: event.id, type: event.type, status: res.status });
				if (res.ok) return res.status;
			} catch (e) {
				deliveries.push({ event: event.id, type: event.type, status: 0, error: e instanceof Error ? e.message : String(e) });
			}
			await new Promise((r) => setTimeout(r, 200 * (attempt + 1)));
		}
		return 0;
	}

	function emit(type, object) {
		const event = { id: id('evt'), object: 'event', type, created: now(), livemode: false, api_version: Stripe.API_VERSION ?? null, data: { object } };
		events.set(event.id, event);
		return deliver(event);
	}

	function createSession(params) {
		const item = params.line_items?.[0] ?? params.line_items?.['0'] ?? {};
		const price = item.price_data ?? {};
		const amount = Number(price.unit_amount) * Number(item.quantity ?? 1);
		if (!params.success_url || !params.cancel_url || !price.currency || !Number.isInteger(amount) || amount <= 0) {
			return { error: 'success_url, cancel_url and one line item with price_data (currency, unit_amount) are required.' };
		}
		const sessionId = id('cs');
		const session = {
			id: sessionId,
			object: 'checkout.session',
			mode: params.mode ?? 'payment',
			status: 'open',
			payment_status: 'unpaid',
			amount_total: amount,
			currency: price.currency,
			client_reference_id: params.client_reference_id ?? null,
			customer_email: params.customer_email ?? null,
			metadata: params.metadata ?? {},
			success_url: params.success_url,
			cancel_url: params.cancel_url,
			expires_at: Number(params.expires_at ?? now() + 24 * 3600),
			created: now(),
			payment_intent: null,
			url: `http://${host}:${port}/pay/${sessionId}`,
			line_name: price.product_data?.name ?? 'Payment'
		};
		sessions.set(sessionId, session);
		return { session };
	}

	function expireSession(session) {
		if (session.status !== 'open') return false;
		session.status = 'expired';
		session.url = null;
		return true;
	}

	/** Pays an open, unexpired session once; paying it again changes nothing (no second charge). */
	async function pay(session) {
		if (session.payment_status === 'paid') return 'already-paid';
		if (session.status !== 'open') return 'expired';
		if (session.expires_at <= now()) {
			expireSession(session);
			void emit('checkout.session.expired', publicSession(session));
			return 'expired';
		}
		const intent = id('pi');
		payments.set(intent, { id: intent, amount: session.amount_total, currency: session.currency, session: session.id, refunded: 0 });
		Object.assign(session, { status: 'complete', payment_status: 'paid', payment_intent: intent });
		await emit('checkout.session.completed', publicSession(session));
		return 'paid';
	}

	function refund(params) {
		const payment = payments.get(params.payment_intent);
		if (!payment) return { status: 404, error: `No such payment_intent: '${params.payment_intent}'` };
		const amount = params.amount ? Number(params.amount) : payment.amount - payment.refunded;
		if (amount <= 0 || payment.refunded + amount > payment.amount) {
			return { status: 400, error: `Charge for ${payment.id} has already been refunded.`, code: 'charge_already_refunded' };
		}
		payment.refunded += amount;
		const r = { id: id('re'), object: 'refund', amount, currency: payment.currency, payment_intent: payment.id, status: 'succeeded', reason: params.reason ?? null, metadata: params.metadata ?? {}, created: now() };
		refunds.set(r.id, r);
		return { refund: r };
	}

	async function api(req, res, url) {
		const body = req.method === 'POST' ? decodeForm(await readBody(req)) : {};
		const key = req.method === 'POST' ? req.headers['idempotency-key'] : undefined;
		if (key && idempotent.has(`${url.pathname}:${key}`)) {
			const [status, value] = idempotent.get(`${url.pathname}:${key}`);
			return sendJson(res, status, value);
		}
		const remember = (status, value) => {
			if (key) idempotent.set(`${url.pathname}:${key}`, [status, value]);
			sendJson(res, status, value);
		};
		const parts = url.pathname.split('/').filter(Boolean); // v1, checkout, sessions, id, expire
		if (parts[1] === 'checkout' && parts[2] === 'sessions') {
			if (parts.length === 3 && req.method === 'POST') {
				const made = createSession(body);
				return made.error ? apiError(res, 400, made.error, 'parameter_missing') : remember(200, publicSession(made.session));
			}
			const session = sessions.get(parts[3]);
			if (!session) return apiError(res, 404, `No such checkout.session: '${parts[3]}'`);
			if (parts.length === 4 && req.method === 'GET') return sendJson(res, 200, publicSession(session));
			if (parts[4] === 'expire' && req.method === 'POST') {
				if (!expireSession(session)) return apiError(res, 400, `Only open sessions can be expired; this one is ${session.status}.`, 'checkout_session_not_open');
				void emit('checkout.session.expired', publicSession(session));
				return remember(200, publicSession(session));
			}
		}
		if (parts[1] === 'refunds' && parts.length === 2 && req.method === 'POST') {
			const made = refund(body);
			return made.error ? apiError(res, made.status, made.error, made.code) : remember(200, made.refund);
		}
		return apiError(res, 404, `Unrecognized request URL (${req.method}: ${url.pathname}).`, 'unknown_route');
	}

	async function handle(req, res) {
		const url = new URL(req.url ?? '/', `http://${host}:${port}`);
		const parts = url.pathname.split('/').filter(Boolean);
		if (parts[0] === 'v1') return api(req, res, url);
		if (parts[0] === 'pay' && parts[1]) {
			const session = sessions.get(parts[1]);
			if (!session) return res.writeHead(404, { 'content-type': 'text/plain' }).end('No such checkout session.');
			if (parts.length === 2 && req.method === 'GET') {
				res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
				return res.end(paymentPage(session));
			}
			if (parts[2] === 'pay' && req.method === 'POST') {
				const outcome = await pay(session);
				if (outcome === 'expired') return res.writeHead(303, { location: `/pay/${session.id}` }).end();
				return res.writeHead(303, { location: session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id) }).end();
			}
			if (parts[2] === 'cancel' && req.method === 'POST') {
				return res.writeHead(303, { location: session.cancel_url.replace('{CHECKOUT_SESSION_ID}', session.id) }).end();
			}
		}
		if (parts[0] === '_fake') {
			if (parts[1] === 'state' && req.method === 'GET') {
				return sendJson(res, 200, {
					sessions: [...sessions.values()].map(publicSession),
					payments: [...payments.values()],
					refunds: [...refunds.values()],
					deliveries
				});
			}
			if (parts[1] === 'sessions' && parts[3] === 'pay' && req.method === 'POST') {
				const session = sessions.get(parts[2]);
				if (!session) return apiError(res, 404, 'No such checkout session.');
				return sendJson(res, 200, { outcome: await pay(session), session: publicSession(session) });
			}
			if (parts[1] === 'events' && parts[3] === 'resend' && req.method === 'POST') {
				const event = events.get(parts[2]);
				if (!event) return apiError(res, 404, 'No such event.');
				return sendJson(res, 200, { status: await deliver(event) });
			}
			if (parts[1] === 'outage' && req.method === 'POST') {
				const ms = Math.min(60_000, Number(url.searchParams.get('ms') ?? 1000));
				sendJson(res, 200, { down: ms });
				res.on('finish', () => void outage(ms));
				return;
			}
		}
		res.writeHead(404, { 'content-type': 'text/plain' }).end('Not found.');
	}

	let server = null;
	const sockets = new Set();
	function listen() {
		server = http.createServer((req, res) => {
			handle(req, res).catch((e) => {
				if (!res.headersSent) apiError(res, 500, e instanceof Error ? e.message : String(e), 'api_error');
			});
		});
		server.on('connection', (socket) => {
			sockets.add(socket);
			socket.on('close', () => sockets.delete(socket));
		});
		return new Promise((resolve, reject) => {
			server.once('error', reject);
			server.listen(port, host, resolve);
		});
	}
	function close() {
		return new Promise((resolve) => {
			if (!server) return resolve();
			server.close(() => resolve());
			for (const socket of sockets) socket.destroy();
			server = null;
		});
	}
	/** The provider unreachable for a while: what it knew is still there when it returns. */
	async function outage(ms) {
		await close();
		await new Promise((r) => setTimeout(r, ms));
		await listen();
	}

	await listen();
	const endpoint = `http://${host}:${port}`;
	return {
		endpoint,
		env: {
			STRIPE_SECRET_KEY: 'sk_test_squarelaw_fake',
			STRIPE_WEBHOOK_SECRET: webhookSecret,
			STRIPE_API_HOST: host,
			STRIPE_API_PORT: String(port),
			STRIPE_API_PROTOCOL: 'http',
			PAYMENT_FAKE_URL: endpoint
		},
		stop: close
	};
}
