/**
 * New elements with sensible first values for a tabletop (a small flash, a white card, a black flag),
 * and the modifiers offered before the gear shelf is connected. The figures are round demo values of
 * our own, not data of any product: the gear shelf's measured figures replace them.
 */
import { SKY_PRESETS } from '$lib/light/ambient';
import { LOWEST_POWER } from '$lib/light/flash';
import type { ElementKind, ElementOfKind, Modifier, ReflectorFinish } from './schema';
import type { EditorModel } from './types';

/** Common practice: electronic flash is close to daylight, tungsten halogen lamps about 3200 K. */
export const DEFAULT_FLASH_KELVIN = 5500;
export const DEFAULT_CONTINUOUS_KELVIN = 3200;
/** Common practice: overcast daylight is about 6500 K. */
export const DEFAULT_DAYLIGHT_KELVIN = 6500;

/**
 * A reflector's face, its surface and the share of light it returns. From memory (typical figures, not
 * measurements): white card or foam board about 85 %, diffuse; a silver face about 90 %, mirror-like; a
 * gold face about 75 %, mirror-like and warmer; a black card about 5 %, the "negative fill" that takes
 * light away. A measured reflectance from the gear shelf or typed by hand replaces these.
 */
export const REFLECTOR_FINISHES: Record<ReflectorFinish, { label: string; surface: 'diffuse' | 'specular'; reflectance: number }> = {
	white: { label: 'White', surface: 'diffuse', reflectance: 0.85 },
	silver: { label: 'Silver', surface: 'specular', reflectance: 0.9 },
	gold: { label: 'Gold', surface: 'specular', reflectance: 0.75 },
	black: { label: 'Black', surface: 'diffuse', reflectance: 0.05 }
};

/** The reflector finish a surface and reflectance are (null: neither, e.g. a measured figure). */
export function finishOf(el: { surface: 'diffuse' | 'specular'; reflectance: number }): ReflectorFinish | null {
	const names = Object.keys(REFLECTOR_FINISHES) as ReflectorFinish[];
	return names.find((f) => REFLECTOR_FINISHES[f].surface === el.surface && REFLECTOR_FINISHES[f].reflectance === el.reflectance) ?? null;
}

export const MODIFIER_PRESETS: readonly Modifier[] = [
	{ name: 'Bare head', beamAngleDeg: 60, lossStops: 0, sizeM: 0.075 },
	{ name: 'Small softbox (30 cm)', beamAngleDeg: 100, lossStops: 1.5, sizeM: 0.3, emitterShape: 'rectangle' },
	{ name: 'Mini softbox (15 cm)', beamAngleDeg: 90, lossStops: 1, sizeM: 0.15, emitterShape: 'rectangle' },
	{ name: 'Diffusion dome', beamAngleDeg: 150, lossStops: 1.5, sizeM: 0.08, emitterShape: 'disc' },
	{ name: 'Snoot', beamAngleDeg: 20, lossStops: 1, sizeM: 0.04 },
	{ name: 'Grid (20°)', beamAngleDeg: 20, lossStops: 1, sizeM: 0.075 }
];

export const KIND_LABELS: Record<ElementKind, string> = {
	subject: 'Subject',
	camera: 'Camera',
	flash: 'Flash',
	continuous: 'Continuous light',
	reflector: 'Reflector',
	diffuser: 'Diffuser',
	flag: 'Flag',
	ambient: 'Ambient light',
	background: 'Background'
};

/** A free id such as `flash-2`: short, readable in the exposure panel's warnings. */
export function newElementId(model: EditorModel, kind: ElementKind, taken: ReadonlySet<string> = new Set()): string {
	for (let n = 1; ; n++) {
		const id = `${kind}-${n}`;
		if (!(id in model.elements) && !taken.has(id)) return id;
	}
}

/** A label such as `Flash` or `Flash 2` that no element uses yet. */
export function newElementLabel(model: EditorModel, kind: ElementKind): string {
	const used = new Set(Object.values(model.elements).map((e) => e.label));
	for (let n = 1; ; n++) {
		const label = n === 1 ? KIND_LABELS[kind] : `${KIND_LABELS[kind]} ${n}`;
		if (!used.has(label)) return label;
	}
}

type Placement = { id: string; label: string; xM: number; yM: number; heightM?: number; rotationDeg?: number; zIndex: number };

export function defaultElement<K extends ElementKind>(kind: K, at: Placement): ElementOfKind<K> {
	const common = {
		id: at.id,
		label: at.label,
		xM: at.xM,
		yM: at.yM,
		rotationDeg: at.rotationDeg ?? 0,
		locked: false,
		zIndex: at.zIndex
	};
	const h = at.heightM;
	switch (kind) {
		case 'subject':
			return { ...common, kind, heightM: h ?? 0.03, widthM: 0.08, depthM: 0.06, living: false, facing: 'camera' } as ElementOfKind<K>;
		case 'camera':
			return { ...common, kind, heightM: h ?? 0.1, focalLengthMm: 100, sensorWidthMm: 36, sensorHeightMm: 24, lens: null } as ElementOfKind<K>;
		case 'flash':
			return {
				...common,
				kind,
				heightM: h ?? 0.25,
				guideNumber: 40,
				calibrationOffsetStops: 0,
				power: 1 / 8,
				lowestPower: LOWEST_POWER,
				zoomMm: null,
				modifier: MODIFIER_PRESETS[0],
				otherLossStops: 0,
				kelvin: DEFAULT_FLASH_KELVIN,
				gelMired: 0,
				tiltDeg: 0,
				highSpeedSync: false,
				mainsPowered: false
			} as ElementOfKind<K>;
		case 'continuous':
			return {
				...common,
				kind,
				heightM: h ?? 0.3,
				luxAt1m: 2000,
				modifier: null,
				otherLossStops: 0,
				kelvin: DEFAULT_CONTINUOUS_KELVIN,
				gelMired: 0,
				tiltDeg: 0,
				runsHot: true
			} as ElementOfKind<K>;
		case 'reflector':
			return {
				...common,
				kind,
				heightM: h ?? 0.1,
				widthM: 0.2,
				panelHeightM: 0.2,
				tiltDeg: 0,
				surface: REFLECTOR_FINISHES.white.surface,
				reflectance: REFLECTOR_FINISHES.white.reflectance,
				source: 'ambient',
				facingSet: true
			} as ElementOfKind<K>;
		case 'diffuser':
			return { ...common, kind, heightM: h ?? 0.2, widthM: 0.4, panelHeightM: 0.4, tiltDeg: 0, lossStops: 1 } as ElementOfKind<K>;
		case 'flag':
			return { ...common, kind, heightM: h ?? 0.15, widthM: 0.2, panelHeightM: 0.3, tiltDeg: 0 } as ElementOfKind<K>;
		case 'ambient':
			return {
				...common,
				kind,
				heightM: h ?? 0.3,
				source: 'window',
				ev100: SKY_PRESETS.overcast.ev100,
				kelvin: DEFAULT_DAYLIGHT_KELVIN,
				widthM: 0.6
			} as ElementOfKind<K>;
		case 'background':
			return { ...common, kind, heightM: h ?? 0, widthM: 0.8, depthM: 0.5, colour: '#1c1c1c' } as ElementOfKind<K>;
	}
	throw new Error(`unknown element kind ${kind satisfies never}`);
}
