// Shared by the notebook's integration tests (never imported by the app): real users with a session row
// and a personal access token, a studio with one member per role, and a small valid setup document.
// Everything is made directly in the test database that `npm test` set up; nothing is mocked.
import { randomBytes } from 'node:crypto';
import * as devalue from 'devalue';
import { expect } from 'vitest';
import { db } from '$lib/server/db';
import { memberships, sessions, studios, users, type StudioRole } from '$lib/server/db/schema';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import { createAccessToken } from '$lib/server/db/queries/tokens';
import { toSessionUser } from '$lib/server/db/queries/users';
import { hashSecret } from '$lib/server/tokens';
import type { SessionUser } from '$lib/server/session';
import type { SetupDocumentInput } from '$lib/scene/document';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';

export const ROLES = ['none', 'viewer', 'editor', 'owner', 'admin'] as const;
export type TestRole = (typeof ROLES)[number];

export interface TestUser {
	user: SessionUser;
	personalStudioId: string;
	/** `authjs.session-token=<token>`, for the Cookie header. */
	cookie: string;
	/** A personal access token, for `Authorization: Bearer`. */
	token: string;
}

export function baseUrl(): string {
	const url = process.env.TEST_BASE_URL;
	if (!url) throw new Error('TEST_BASE_URL is not set: run the integration tests through `npm test`, which starts the app.');
	return url.replace(/\/$/, '');
}

const runId = randomBytes(4).toString('hex');
let serial = 0;

/** A user with a personal studio, a live database session and a personal access token. */
export async function makeUser(label: string, { isAdmin = false } = {}): Promise<TestUser> {
	serial += 1;
	const [row] = await db
		.insert(users)
		.values({
			email: `nb-${label}-${runId}-${serial}@test.example`,
			name: `Test ${label} ${serial}`,
			emailVerified: new Date(),
			isAdmin
		})
		.returning();
	const personal = await ensurePersonalStudio(row.id, `Test ${label}`);
	const cookie = await openSession(row.id);
	const token = await createAccessToken(row.id, `notebook tests ${label}`);
	return { user: toSessionUser(row), personalStudioId: personal.id, cookie, token: token.secret };
}

/**
 * A session row as Auth.js's sign-in would leave it (the table keeps the token's SHA-256), by default
 * signed in now and good for a day; returns `authjs.session-token=<token>` for the Cookie header.
 */
export async function openSession(userId: string, { createdAt = new Date(), expires = new Date(Date.now() + 24 * 3600_000) } = {}) {
	const sessionToken = randomBytes(32).toString('hex');
	await db.insert(sessions).values({ sessionToken: hashSecret(sessionToken), userId, expires, createdAt });
	return `authjs.session-token=${sessionToken}`;
}

export interface TestStudio {
	studioId: string;
	/** One user per role; `none` is signed in but not a member, `admin` is a site admin who is not a member. */
	people: Record<TestRole, TestUser>;
}

/** A fresh studio with an owner, an editor and a viewer, plus an outsider and a site admin. */
export async function makeStudio(name = 'Notebook test studio'): Promise<TestStudio> {
	const [owner, editor, viewer, none, admin] = await Promise.all([
		makeUser('owner'),
		makeUser('editor'),
		makeUser('viewer'),
		makeUser('none'),
		makeUser('admin', { isAdmin: true })
	]);
	const [studio] = await db.insert(studios).values({ name: `${name} ${runId}` }).returning();
	const add = (u: TestUser, role: StudioRole) => ({ studioId: studio.id, userId: u.user.id, role });
	await db.insert(memberships).values([add(owner, 'owner'), add(editor, 'editor'), add(viewer, 'viewer')]);
	return { studioId: studio.id, people: { owner, editor, viewer, none, admin } };
}

/** A small valid setup document: one flash and a white card on a quartz-sized subject. */
export function sampleDocument(overrides: { notes?: string; power?: number; plan?: SetupDocumentInput['plan'] } = {}): SetupDocumentInput {
	return {
		schemaVersion: CURRENT_SCHEMA_VERSION,
		scene: {
			camera: { iso: 100, aperture: 16, shutter: 1 / 200, magnification: 0.5 },
			subject: { position: [0, 0, 0.04] },
			lights: [
				{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 40, power: overrides.power ?? 0.25, lossStops: 1.5 },
				{ id: 'card', kind: 'reflector', position: [0.2, -0.05, 0.1], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'key' }
			]
		},
		plan: overrides.plan ?? {},
		notes: overrides.notes ?? ''
	};
}

type Auth = { kind: 'cookie' | 'token' | 'anonymous'; who?: TestUser };

export function authHeaders(auth: Auth): Record<string, string> {
	if (auth.kind === 'anonymous' || !auth.who) return {};
	return auth.kind === 'cookie' ? { cookie: auth.who.cookie } : { authorization: `Bearer ${auth.who.token}` };
}

export interface ApiAnswer<T = any> {
	status: number;
	body: T;
	headers: Headers;
}

/** One request to the running app; a JSON body is sent as JSON, a string as it is. */
export async function api<T = any>(
	method: string,
	path: string,
	{ auth, body, headers = {} }: { auth: Auth; body?: unknown; headers?: Record<string, string> }
): Promise<ApiAnswer<T>> {
	const init: RequestInit = { method, headers: { ...authHeaders(auth), ...headers }, redirect: 'manual' };
	if (body instanceof FormData) {
		// Multipart: fetch writes the boundary; SvelteKit's origin check wants the app's own Origin on a form post.
		init.body = body;
		(init.headers as Record<string, string>).origin ??= baseUrl();
	}
	else if (body !== undefined) {
		init.body = typeof body === 'string' ? body : JSON.stringify(body);
		(init.headers as Record<string, string>)['content-type'] ??= 'application/json';
	}
	const res = await fetch(`${baseUrl()}${path}`, init);
	const text = await res.text();
	let parsed: unknown = text;
	if ((res.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text);
	return { status: res.status, body: parsed as T, headers: res.headers };
}

/** The API's error body (/api/v1/openapi.json, `Error`): a message, and issues naming the fields at fault. */
export function expectErrorBody(answer: ApiAnswer, status: number, field?: string) {
	expect(answer.status, JSON.stringify(answer.body)).toBe(status);
	expect(typeof answer.body.error?.message).toBe('string');
	expect(Array.isArray(answer.body.error?.issues)).toBe(true);
	if (field !== undefined) {
		const paths = (answer.body.error.issues as { path: string[] }[]).map((i) => i.path.join('.'));
		expect(paths, `issues should name ${field}`).toContain(field);
	}
}

export interface ActionAnswer {
	/** SvelteKit's result type: `success`, `failure`, `redirect` or `error`. */
	type: 'success' | 'failure' | 'redirect' | 'error';
	/** The action's status: fail()'s, error()'s, or the redirect's. */
	status: number;
	location?: string;
	/** What `fail()` or a success returned, decoded as the page's script decodes it. */
	data?: any;
	error?: { message: string };
}

/**
 * A named form action posted as `use:enhance` posts it (SvelteKit answers JSON with the action's result),
 * signed in with `who`'s session cookie. `form` may hold files.
 */
export async function postAction(path: string, form: Record<string, string> | FormData, who?: TestUser): Promise<ActionAnswer> {
	const res = await fetch(`${baseUrl()}${path}`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: baseUrl(), accept: 'application/json', 'x-sveltekit-action': 'true', ...(who ? { cookie: who.cookie } : {}) },
		body: form instanceof FormData ? form : new URLSearchParams(form)
	});
	const body = await res.json();
	const status = body.type === 'error' ? res.status : body.status;
	return { type: body.type, status, location: body.location, data: body.data ? devalue.parse(body.data) : undefined, error: body.error };
}
