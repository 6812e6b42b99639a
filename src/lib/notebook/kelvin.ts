/**
 * Drawing colours of a light from its colour temperature, for the notebook's sketches and thumbnails.
 * The fill is the light's own colour from the editor's Planckian-locus conversion
 * (`$lib/editor/kelvin-colour`, Kim et al. 2002), so a sketch and the plan editor agree; the stroke is
 * our own ramp that stays visible on paper and on the dim theme. For drawing only; never used in
 * exposure or white-balance math.
 */
import { kelvinToHex as locusHex, kelvinToRgb as locusRgb } from '$lib/editor/kelvin-colour';

/** Default drawing temperatures when a light gives none: a small flash and a tungsten lamp (common practice). */
export const DEFAULT_FLASH_KELVIN = 5500;
export const DEFAULT_CONTINUOUS_KELVIN = 3200;
export const DEFAULT_DAYLIGHT_KELVIN = 6500;

const drawable = (kelvin: number) => (Number.isFinite(kelvin) ? kelvin : DEFAULT_FLASH_KELVIN);

export function kelvinToRgb(kelvin: number): [number, number, number] {
	return locusRgb(drawable(kelvin));
}

export function kelvinToHex(kelvin: number): string {
	return locusHex(drawable(kelvin));
}

/**
 * A colour that shows on paper and on the dark theme: black-body whites vanish on a pale page, so
 * outlines and beams use our own ramp from deep tungsten through a neutral grey to daylight blue,
 * interpolated in mired (even steps of mired look like even steps of colour).
 */
const STROKE_ANCHORS: [number, [number, number, number]][] = [
	[1500, [178, 59, 18]],
	[2400, [201, 98, 26]],
	[3200, [217, 130, 43]],
	[4300, [196, 150, 70]],
	[5500, [150, 140, 110]],
	[6500, [110, 128, 146]],
	[8000, [72, 122, 176]],
	[12000, [45, 100, 170]]
];

function interpolate(anchors: [number, [number, number, number]][], kelvin: number): [number, number, number] {
	const k = Math.min(anchors[anchors.length - 1][0], Math.max(anchors[0][0], Number.isFinite(kelvin) ? kelvin : 5500));
	for (let i = 1; i < anchors.length; i++) {
		const [k1, c1] = anchors[i];
		if (k <= k1) {
			const [k0, c0] = anchors[i - 1];
			const t = (1 / k0 - 1 / k) / (1 / k0 - 1 / k1);
			return [0, 1, 2].map((j) => Math.round(c0[j] + (c1[j] - c0[j]) * t)) as [number, number, number];
		}
	}
	return anchors[anchors.length - 1][1];
}

export function kelvinToStroke(kelvin: number): string {
	return '#' + interpolate(STROKE_ANCHORS, kelvin).map((v) => v.toString(16).padStart(2, '0')).join('');
}
