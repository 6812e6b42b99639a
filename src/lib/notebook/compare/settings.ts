/** The camera, subject and ambient settings of two revisions, compared field by field. */
import { formatFNumber, formatShutter, formatStops, roundSig } from '$lib/light/format';
import type { ExposureScene } from '$lib/light/schema';
import { stopsBetween, stopsNote } from './lights';
import { shownChange, shownStops } from './shown';
import type { SettingEntry } from './index';

type Camera = ExposureScene['camera'];

/** Optional camera fields: their name and how a value reads. */
const OPTIONAL_CAMERA_FIELDS: [keyof Camera, string, (v: number) => string][] = [
	['pupilMagnification', 'Pupil magnification', (v) => `${roundSig(v)}`],
	['cocMm', 'Circle of confusion', (v) => `${roundSig(v * 1000)} µm`],
	['wavelengthNm', 'Wavelength for diffraction', (v) => `${roundSig(v)} nm`],
	['lossStops', 'Lens filter loss', (v) => `${roundSig(v, 2)} stops`],
	['syncSpeed', 'Sync speed', (v) => formatShutter(v)],
	['minAperture', 'Widest aperture in the table', (v) => formatFNumber(v)],
	['maxAperture', 'Narrowest aperture in the table', (v) => formatFNumber(v)]
];

/** ` (−1 stop of light)`, or nothing under a tenth of a stop. */
function ofLight(stops: number, what: string): string {
	return shownStops(stops) === 0 ? '' : ` (${formatStops(stops)} of ${what})`;
}

export function settingChanges(a: ExposureScene, b: ExposureScene): SettingEntry[] {
	const out: SettingEntry[] = [];
	const push = (setting: string, before: unknown, after: unknown, text: string | null) => {
		if (text !== null) out.push({ setting, before, after, text });
	};
	/** `Name before → after (note)` when the two read differently (see shown.ts). */
	const change = <T>(name: string, before: T, after: T, fmt: (v: T) => string, note = '') => {
		const shown = shownChange(before, after, fmt);
		return shown === null ? null : `${name} ${shown}${note}`;
	};
	const ca = a.camera;
	const cb = b.camera;
	push('iso', ca.iso, cb.iso, change('ISO', ca.iso, cb.iso, (v) => roundSig(v, 4), stopsNote(stopsBetween(ca.iso, cb.iso))));
	push('aperture', ca.aperture, cb.aperture, change('Aperture', ca.aperture, cb.aperture, (v) => formatFNumber(v), ofLight(-2 * stopsBetween(ca.aperture, cb.aperture), 'light')));
	push('shutter', ca.shutter, cb.shutter, change('Shutter speed', ca.shutter, cb.shutter, formatShutter, ofLight(stopsBetween(ca.shutter, cb.shutter), 'ambient')));
	push('magnification', ca.magnification, cb.magnification, change('Magnification', ca.magnification, cb.magnification, (v) => `${roundSig(v)}×`));
	for (const [key, name, fmt] of OPTIONAL_CAMERA_FIELDS) {
		const va = ca[key] as number | undefined;
		const vb = cb[key] as number | undefined;
		push(key, va ?? null, vb ?? null, change(name, va, vb, (v) => (v === undefined ? 'not set' : fmt(v))));
	}
	if ((ca.centreColumn ?? 'down') !== (cb.centreColumn ?? 'down'))
		push('centreColumn', ca.centreColumn ?? 'down', cb.centreColumn ?? 'down', `Tripod centre column ${ca.centreColumn ?? 'down'} → ${cb.centreColumn ?? 'down'}`);
	const aa = a.ambient;
	const ab = b.ambient;
	if (!aa && ab) push('ambient', null, ab.ev100, `Ambient light added: EV ${roundSig(ab.ev100, 3)} at ISO 100`);
	else if (aa && !ab) push('ambient', aa.ev100, null, `Ambient light removed (was EV ${roundSig(aa.ev100, 3)})`);
	else if (aa && ab) {
		push('ambient.ev100', aa.ev100, ab.ev100, change('Ambient EV', aa.ev100, ab.ev100, (v) => roundSig(v, 3), stopsNote(ab.ev100 - aa.ev100)));
		push('ambient.kelvin', aa.kelvin ?? null, ab.kelvin ?? null, change('Ambient colour temperature', aa.kelvin || undefined, ab.kelvin || undefined, (k) => (k === undefined ? 'not set' : `${roundSig(k, 4)} K`)));
	}
	if ((a.subject.living ?? false) !== (b.subject.living ?? false))
		push('subject.living', a.subject.living ?? false, b.subject.living ?? false, b.subject.living ? 'The subject is now marked as a living person or animal' : 'The subject is no longer marked as living');
	return out;
}
