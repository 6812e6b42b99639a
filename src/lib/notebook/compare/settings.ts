/** The camera, subject and ambient settings of two revisions, compared field by field. */
import { formatFNumber, formatShutter, formatStops, roundSig } from '$lib/light/format';
import type { ExposureScene } from '$lib/light/schema';
import { beforeAfter, stopsBetween } from './lights';
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

export function settingChanges(a: ExposureScene, b: ExposureScene): SettingEntry[] {
	const out: SettingEntry[] = [];
	const push = (setting: string, before: unknown, after: unknown, text: string) => out.push({ setting, before, after, text });
	const ca = a.camera;
	const cb = b.camera;
	if (ca.iso !== cb.iso) push('iso', ca.iso, cb.iso, `ISO ${ca.iso} → ${cb.iso} (${formatStops(stopsBetween(ca.iso, cb.iso))})`);
	if (ca.aperture !== cb.aperture)
		push('aperture', ca.aperture, cb.aperture, `Aperture ${formatFNumber(ca.aperture)} → ${formatFNumber(cb.aperture)} (${formatStops(-2 * stopsBetween(ca.aperture, cb.aperture))} of light)`);
	if (ca.shutter !== cb.shutter)
		push('shutter', ca.shutter, cb.shutter, `Shutter speed ${formatShutter(ca.shutter)} → ${formatShutter(cb.shutter)} (${formatStops(stopsBetween(ca.shutter, cb.shutter))} of ambient)`);
	if (ca.magnification !== cb.magnification)
		push('magnification', ca.magnification, cb.magnification, `Magnification ${roundSig(ca.magnification)}× → ${roundSig(cb.magnification)}×`);
	for (const [key, name, fmt] of OPTIONAL_CAMERA_FIELDS) {
		const va = ca[key] as number | undefined;
		const vb = cb[key] as number | undefined;
		if (va !== vb) push(key, va ?? null, vb ?? null, `${name} ${beforeAfter(va, vb, fmt)}`);
	}
	if ((ca.centreColumn ?? 'down') !== (cb.centreColumn ?? 'down'))
		push('centreColumn', ca.centreColumn ?? 'down', cb.centreColumn ?? 'down', `Tripod centre column ${ca.centreColumn ?? 'down'} → ${cb.centreColumn ?? 'down'}`);
	const aa = a.ambient;
	const ab = b.ambient;
	if (!aa && ab) push('ambient', null, ab.ev100, `Ambient light added: EV ${roundSig(ab.ev100, 3)} at ISO 100`);
	else if (aa && !ab) push('ambient', aa.ev100, null, `Ambient light removed (was EV ${roundSig(aa.ev100, 3)})`);
	else if (aa && ab) {
		if (aa.ev100 !== ab.ev100) push('ambient.ev100', aa.ev100, ab.ev100, `Ambient EV ${roundSig(aa.ev100, 3)} → ${roundSig(ab.ev100, 3)} (${formatStops(ab.ev100 - aa.ev100)})`);
		if (aa.kelvin !== ab.kelvin) push('ambient.kelvin', aa.kelvin ?? null, ab.kelvin ?? null, `Ambient colour temperature ${beforeAfter(aa.kelvin || undefined, ab.kelvin || undefined, (k) => `${k} K`)}`);
	}
	if ((a.subject.living ?? false) !== (b.subject.living ?? false))
		push('subject.living', a.subject.living ?? false, b.subject.living ?? false, b.subject.living ? 'The subject is now marked as a living person or animal' : 'The subject is no longer marked as living');
	return out;
}
