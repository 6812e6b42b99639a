// The camera settings as a printed sheet lists them: the setup sheet and the workshop handout.
import type { ExposureResult } from '$lib/light/scene';
import type { ExposureScene } from '$lib/light/schema';
import { formatFNumber, formatShutter, roundSig } from '$lib/light/format';

const ratio = (m: number) => (m <= 0 ? 'not close-up' : m >= 1 ? `${roundSig(m, 3)}:1` : `1:${roundSig(1 / m, 3)}`);

export function sheetSettings(camera: ExposureScene['camera'], ambient: ExposureScene['ambient'], exposure: Pick<ExposureResult, 'workingAperture'> | null): [string, string][] {
	return [
		['ISO', String(camera.iso)],
		['Aperture (marked)', formatFNumber(camera.aperture)],
		['Shutter speed', formatShutter(camera.shutter)],
		['Magnification', `${roundSig(camera.magnification, 3)}× (${ratio(camera.magnification)})`],
		...(exposure ? [['Working aperture', formatFNumber(exposure.workingAperture)] as [string, string]] : []),
		...(ambient ? [['Ambient', `EV ${roundSig(ambient.ev100, 3)} at ISO 100`] as [string, string]] : [])
	];
}
