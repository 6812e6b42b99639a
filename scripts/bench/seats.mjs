// Seats bench: fifty buyers race for the ten seats of a paid workshop, over HTTP against the built server
// as browsers would ("Book a seat" on the public page, each signed in with a session of their own), with
// the payment fake answering the checkouts and sending the webhooks. Five of the ten holds then run out,
// five of the buyers told it was full book again, and all fifteen checkouts are paid at once. Figures:
// confirmed seats (must be exactly 10), buyers told it is full (40), payments taken and refunded at the
// fake, payments kept without a seat (must be 0), and the booking request's and the settlement's times.
import { createHash, randomBytes } from 'node:crypto';
import * as devalue from 'devalue';
import postgres from 'postgres';
import { median, percentile, round } from '../lib/stats.mjs';

const BUYERS = 50;
const SEATS = 10;
const LAPSED = 5;

async function sessionCookie(sql, userId) {
	const token = randomBytes(32).toString('hex');
	// The sessions table keeps the SHA-256 of the cookie's token (see hashed-sessions.ts).
	const hash = createHash('sha256').update(token).digest('hex');
	await sql`insert into sessions (session_token, user_id, expires) values (${hash}, ${userId}, now() + interval '1 hour')`;
	return `authjs.session-token=${token}`;
}

/** A paid, published workshop of the seeded studio with `SEATS` seats at 25.00 EUR. */
async function paidWorkshop(sql) {
	const [studio] = await sql`select id from studios where name = 'Fernhill Geology Circle' and deleted_at is null limit 1`;
	if (!studio) throw new Error('the seed has no studio “Fernhill Geology Circle”');
	const slug = `seats-bench-${randomBytes(4).toString('hex')}`;
	const [w] = await sql`
		insert into workshops (studio_id, slug, title, capacity, state, price_minor, currency)
		values (${studio.id}, ${slug}, 'Seats bench evening', ${SEATS}, 'published', 2500, 'eur') returning id`;
	await sql`insert into workshop_sessions (workshop_id, starts_at, ends_at, place) values (${w.id}, '2027-01-14T18:30:00Z', '2027-01-14T21:00:00Z', 'Community hall')`;
	return { workshopId: w.id, slug };
}

/** "Book a seat" as the page's enhanced form sends it; the checkout's address, or the refusal's message. */
async function book(baseUrl, slug, cookie) {
	const started = performance.now();
	const res = await fetch(`${baseUrl}/w/${slug}?/book`, {
		method: 'POST',
		headers: { cookie, origin: baseUrl, accept: 'application/json', 'x-sveltekit-action': 'true', 'content-type': 'application/x-www-form-urlencoded' },
		body: ''
	});
	const body = await res.json();
	const ms = performance.now() - started;
	const data = body.data ? devalue.parse(body.data) : {};
	if (body.type === 'success' && data.checkoutUrl) return { ms, checkoutUrl: data.checkoutUrl, bookingId: data.bookingId };
	return { ms, refused: Object.values(data.errors ?? {})[0] ?? `${res.status} ${body.type}` };
}

export async function run({ baseUrl, databaseUrl, env, log = console.log }) {
	const fake = env?.PAYMENT_FAKE_URL;
	if (!fake) throw new Error('the seats bench needs the payment fake (unset STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET)');
	const sql = postgres(databaseUrl, { max: 2, onnotice: () => {} });
	try {
		const { workshopId, slug } = await paidWorkshop(sql);
		const buyers = [];
		for (let i = 0; i < BUYERS; i++) {
			const [u] = await sql`insert into users (email, name, email_verified) values (${`buyer.${i}.${randomBytes(3).toString('hex')}@fernhill.example`}, ${`Buyer ${i}`}, now()) returning id`;
			buyers.push({ id: u.id, cookie: await sessionCookie(sql, u.id) });
		}

		const first = await Promise.all(buyers.map((b) => book(baseUrl, slug, b.cookie)));
		const held = first.filter((r) => r.checkoutUrl);
		const full = first.filter((r) => r.refused && /full/.test(r.refused));
		log(`round 1: ${held.length} seats held, ${full.length} told it is full, ${first.length - held.length - full.length} other answers`);

		// Five holds run out; five of the buyers told it was full try again.
		const lapsed = held.slice(0, LAPSED);
		await sql`update seat_bookings set hold_expires_at = now() - interval '1 second' where id in ${sql(lapsed.map((h) => h.bookingId))}`;
		const again = buyers.filter((_, i) => !first[i].checkoutUrl).slice(0, LAPSED);
		const second = await Promise.all(again.map((b) => book(baseUrl, slug, b.cookie)));
		const checkouts = [...held, ...second.filter((r) => r.checkoutUrl)];
		log(`round 2: ${second.filter((r) => r.checkoutUrl).length} more held after ${LAPSED} holds ran out`);

		// Every checkout paid at once; the fake answers once the app has taken the webhook.
		const payStarted = performance.now();
		const paid = await Promise.all(
			checkouts.map(async (c) => (await fetch(`${fake}/_fake/sessions/${c.checkoutUrl.split('/').pop()}/pay`, { method: 'POST' })).json())
		);
		const settleMs = performance.now() - payStarted;

		const [{ confirmed }] = await sql`select count(*)::int as confirmed from seat_bookings where workshop_id = ${workshopId} and state = 'confirmed'`;
		const [{ refunded }] = await sql`select count(*)::int as refunded from seat_bookings where workshop_id = ${workshopId} and state = 'refunded'`;
		const [{ students }] = await sql`select count(*)::int as students from workshop_members where workshop_id = ${workshopId} and role = 'student'`;
		const confirmedIntents = new Set((await sql`select payment_intent_id from seat_bookings where workshop_id = ${workshopId} and state = 'confirmed'`).map((r) => r.payment_intent_id));
		const state = await (await fetch(`${fake}/_fake/state`)).json();
		const intents = new Set(paid.map((p) => p.session?.payment_intent).filter(Boolean));
		const payments = state.payments.filter((p) => intents.has(p.id));
		const kept = payments.filter((p) => p.refunded < p.amount);
		const keptWithoutSeat = kept.filter((p) => !confirmedIntents.has(p.id)).length;
		const bookMs = [...first, ...second].map((r) => r.ms);

		const figures = {
			buyers: BUYERS,
			seats: SEATS,
			confirmed,
			students,
			toldFull: full.length,
			payments: payments.length,
			refunds: payments.length - kept.length,
			refundedBookings: refunded,
			keptWithoutSeat,
			bookRequestMs: { median: round(median(bookMs)), p95: round(percentile(bookMs, 0.95)) },
			settleAllMs: round(settleMs)
		};
		const met = confirmed === SEATS && students === SEATS && full.length === BUYERS - SEATS && keptWithoutSeat === 0 && payments.length - kept.length === LAPSED;
		log(`confirmed ${confirmed} of ${SEATS} seats (students ${students}), ${full.length} of ${BUYERS} told it is full`);
		log(`payments ${payments.length}, refunded ${payments.length - kept.length}, kept without a seat ${keptWithoutSeat}`);
		log(`"Book a seat" request: median ${figures.bookRequestMs.median} ms, p95 ${figures.bookRequestMs.p95} ms (${BUYERS} at once); ${checkouts.length} payments settled in ${figures.settleAllMs} ms`);
		log(`goal (exactly ${SEATS} confirmed, ${BUYERS - SEATS} told full, no payment kept without a seat): ${met ? 'met' : 'NOT met'}`);
		if (!met) throw new Error(`seats oversold or a payment kept without a seat: ${JSON.stringify(figures)}`);
		return { ...figures, met };
	} finally {
		await sql.end({ timeout: 5 });
	}
}
