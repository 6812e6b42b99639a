/**
 * Helpers for the notebook pages' `load` functions and actions: an API answer that is a refusal
 * becomes the page's own refusal (401 → sign in, 403, 404), so a page never reveals more than the API.
 */
import type { SetupDocument } from '$lib/scene/document';
import { error, redirect } from '@sveltejs/kit';
import { callApi, type Fetch } from './api';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';

/** GET an API path or end the page with the API's status and message. */
export async function getOrFail<T>(fetchFn: Fetch, path: string, url: URL): Promise<T> {
	const r = await callApi<T>(fetchFn, path);
	if (r.ok) return r.data;
	if (r.status === 401) redirect(303, `/signin?callbackUrl=${encodeURIComponent(url.pathname + url.search)}`);
	error(r.status >= 400 && r.status <= 599 ? r.status : 500, r.message);
}

/**
 * The smallest valid setup document: one subject at the origin, a camera set for close-up work (ISO 100,
 * f/11, 1/125 s, half life-size: a common macro starting point), no lights, an empty plan.
 */
export function blankDocument(): SetupDocument {
	return {
		schemaVersion: CURRENT_SCHEMA_VERSION,
		scene: {
			camera: { iso: 100, aperture: 11, shutter: 1 / 125, magnification: 0.5 },
			subject: { position: [0, 0, 0] },
			lights: []
		},
		plan: {},
		notes: '',
		gear: []
	};
}

/** Labels of every element by id, from the plan (ids where the plan has no label). */
export function elementLabels(doc: SetupDocument): Record<string, string> {
	const out: Record<string, string> = {};
	for (const light of doc.scene.lights) out[light.id] = light.id;
	for (const flag of doc.scene.flags ?? []) out[flag.id] = flag.id;
	for (const [id, el] of Object.entries(doc.plan?.elements ?? {})) if (el?.label?.trim()) out[id] = el.label.trim();
	return out;
}

const WHEN = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

/** A date-time for people; fixed locale and zone so the server and the browser render the same text. */
export function formatWhen(iso: string): string {
	const d = new Date(iso);
	if (Number.isNaN(d.getTime())) return iso;
	return `${WHEN.format(d)} UTC`;
}

/**
 * Spread onto a `<details>` to open it when `open` is true (a form came back with errors). A spread
 * rather than `open={…}`: Svelte's hydration resets a plain `open` attribute, closing a section the
 * user opened before the page finished loading; a spread only sets what it names.
 */
export function openIf(open: boolean): { open?: true } {
	return open ? { open: true } : {};
}
