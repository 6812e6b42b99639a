/**
 * Small helpers shared by the notebook pages: a blank document, element labels, dates for people and
 * sections that open when a form comes back with errors.
 */
import type { SetupDocument } from '$lib/scene/document';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';

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

export type WhenStyle = 'datetime' | 'date';

const STYLES: Record<WhenStyle, Intl.DateTimeFormatOptions> = {
	datetime: { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' },
	date: { day: 'numeric', month: 'short', year: 'numeric' }
};

/**
 * The server's formats, made once: making an Intl.DateTimeFormat costs far more than formatting with
 * one, and a notebook page writes two dates a row (it was a tenth of the list's time on the server).
 */
const UTC_FORMATS: Record<WhenStyle, Intl.DateTimeFormat> = {
	datetime: new Intl.DateTimeFormat('en-GB', { ...STYLES.datetime, timeZone: 'UTC' }),
	date: new Intl.DateTimeFormat('en-GB', { ...STYLES.date, timeZone: 'UTC' })
};

/**
 * A date-time for people. Without `timeZone` it is written in UTC and says so: that is what the server
 * renders and the page hydrates with. `When.svelte` then writes it again in the reader's own zone
 * (`timeZone: 'local'`), once the page is live.
 */
export function formatWhen(at: string | Date, style: WhenStyle = 'datetime', timeZone: 'UTC' | 'local' = 'UTC'): string {
	const d = new Date(at);
	if (Number.isNaN(d.getTime())) return String(at);
	if (timeZone === 'UTC') return `${UTC_FORMATS[style].format(d)}${style === 'date' ? '' : ' UTC'}`;
	return new Intl.DateTimeFormat('en-GB', { ...STYLES[style], ...(style === 'date' ? {} : { timeZoneName: 'short' }) }).format(d);
}

/**
 * Spread onto a `<details>` to open it when `open` is true (a form came back with errors). A spread
 * rather than `open={…}`: Svelte's hydration resets a plain `open` attribute, closing a section the
 * user opened before the page finished loading; a spread only sets what it names.
 */
export function openIf(open: boolean): { open?: true } {
	return open ? { open: true } : {};
}
