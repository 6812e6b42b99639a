/**
 * The inspector's fields for each kind of element, as data: what each shows (in the trade's notation,
 * angles to 1°) and how typed text becomes a property patch for `setElementProperties`. Lengths are read
 * by the editor's unit parser (`30 cm`, `12 in`; a bare number is cm or inches), so they only name it.
 * Pure: tested without a browser.
 */
import { SKY_PRESET_NAMES, SKY_PRESETS, type SkyPreset } from '$lib/light/ambient';
import { roundSig } from '$lib/light/format';
import { plainNumber } from '$lib/light/number-text';
import { finishOf, REFLECTOR_FINISHES } from '../../model/defaults';
import { aimAngles, direction3 } from '../../model/geometry';
import { formatPower, parsePower } from '../../model/power-notation';
import type { EditorElement, Modifier, ReflectorFinish } from '../../model/schema';
import type { ShelfGear } from '../../model/shelf';
import { flashFiguresFromShelf } from '../../commands-gear';

export { finishOf };

/** The sky preset an EV is (null: metered or typed). */
export function skyPresetOf(ev100: number): SkyPreset | null {
	return SKY_PRESET_NAMES.find((p) => SKY_PRESETS[p].ev100 === ev100) ?? null;
}

export type Patch = Record<string, unknown>;
export type Reading = { ok: true; patch: Patch } | { ok: false; message: string };

interface Common {
	/** The property it sets (the id of its input is `prop-<key>`; errors are matched on it). */
	key: string;
	label: string;
}
export type InspectorField =
	| (Common & { type: 'text'; text: string; read: (text: string) => Reading; hint?: string })
	| (Common & { type: 'length'; valueM: number; key: string; toPatch?: (valueM: number) => Patch })
	| (Common & { type: 'select'; value: string; options: { value: string; label: string }[]; choose: (value: string) => Patch })
	| (Common & { type: 'toggle'; checked: boolean });

/** A number as people read it: to 3 significant figures. */
const shown = (n: number) => roundSig(n, 3);

/** A plain number, then a check the schema would make too, said in words for the field. */
function number(key: string, text: string, toValue: (n: number) => unknown = (n) => n): Reading {
	const n = plainNumber(text);
	if (n === null) return { ok: false, message: 'must be a number' };
	return { ok: true, patch: { [key]: toValue(n) } };
}

/** A number, or empty for "not stated" (null). */
function optionalNumber(key: string, text: string): Reading {
	return text.trim() === '' ? { ok: true, patch: { [key]: null } } : number(key, text);
}

const numberField = (key: string, label: string, value: number, hint?: string): InspectorField => ({
	type: 'text',
	key,
	label,
	text: shown(value),
	read: (t) => number(key, t),
	hint
});

/** An angle, shown to the nearest degree. */
const angleField = (key: string, label: string, deg: number): InspectorField => ({ type: 'text', key, label, text: String(Math.round(deg)), read: (t) => number(key, t) });

const kelvinField = (kelvin: number | null): InspectorField => ({
	type: 'text',
	key: 'kelvin',
	label: 'Colour temperature (K)',
	text: kelvin === null ? '' : String(Math.round(kelvin)),
	read: (t) => optionalNumber('kelvin', t),
	hint: 'empty: not stated'
});

export const POWER_FIELD_HINT = 'e.g. 1/32, 1/8 +0.3, 0.25, -3 EV';

function powerField(power: number, key = 'power', label = 'Power', hint = POWER_FIELD_HINT): InspectorField {
	return {
		type: 'text',
		key,
		label,
		text: formatPower(power),
		hint,
		read: (t) => {
			const r = parsePower(t);
			return r.ok ? { ok: true, patch: { [key]: r.power } } : { ok: false, message: r.message };
		}
	};
}

/**
 * The zoom head: a choice of the shelf flash's zoom positions (each with its guide number, taken with
 * the flash's calibration as the shelf flash is), or typed when the flash is not from the shelf or the
 * shelf lists no positions.
 */
function zoomField(el: Extract<EditorElement, { kind: 'flash' }>, shelfFlash: ShelfGear<'flash'> | undefined): InspectorField {
	const positions = el.gearId && shelfFlash?.id === el.gearId ? (shelfFlash.spec.guideNumbersByZoom ?? []) : [];
	if (positions.length) {
		const listed = positions.some((p) => p.zoomMm === el.zoomMm);
		return {
			type: 'select',
			key: 'zoomMm',
			label: 'Zoom head (guide number there)',
			value: el.zoomMm === null ? '' : String(el.zoomMm),
			options: [
				...(listed ? [] : [{ value: el.zoomMm === null ? '' : String(el.zoomMm), label: el.zoomMm === null ? 'Not set' : `${shown(el.zoomMm)} mm (as saved)` }]),
				...[...positions].sort((a, b) => a.zoomMm - b.zoomMm).map((p) => ({ value: String(p.zoomMm), label: `${shown(p.zoomMm)} mm (GN ${shown(p.guideNumberM)})` }))
			],
			choose: (v) => {
				if (v === '') return {};
				const figures = flashFiguresFromShelf(shelfFlash!, Number(v));
				return { zoomMm: figures.zoomMm, guideNumber: figures.guideNumber };
			}
		};
	}
	return {
		type: 'text',
		key: 'zoomMm',
		label: 'Zoom head (mm)',
		text: el.zoomMm === null ? '' : shown(el.zoomMm),
		read: (t) => optionalNumber('zoomMm', t),
		hint: 'empty: no zoom head'
	};
}

const EMITTER_POINT = 'point';

/**
 * A modifier's front: a point (a bare head, a snoot, a grid) or a front that glows evenly, a rectangle
 * or a disc of its size, which close to the subject is an extended source (the engine's configuration
 * factors, `$lib/light/extended-source`).
 */
function modifierFrontFields(modifier: Modifier): InspectorField[] {
	const set = (patch: Partial<Modifier>): Patch => {
		const next: Modifier = { ...modifier, ...patch };
		if (!next.emitterShape) delete next.emitterShape;
		if (next.emitterShape !== 'rectangle') delete next.heightM;
		return { modifier: next };
	};
	const out: InspectorField[] = [
		{
			type: 'select',
			key: 'emitterShape',
			label: 'Its front',
			value: modifier.emitterShape ?? EMITTER_POINT,
			options: [
				{ value: EMITTER_POINT, label: 'A point (bare head, snoot, grid)' },
				{ value: 'rectangle', label: 'Glows evenly: a rectangle (softbox, panel)' },
				{ value: 'disc', label: 'Glows evenly: a disc (dome, umbrella)' }
			],
			choose: (v) => set({ emitterShape: v === EMITTER_POINT ? undefined : (v as Modifier['emitterShape']) })
		},
		{ type: 'length', key: 'modifierSizeM', label: modifier.emitterShape === 'disc' ? 'Front diameter' : 'Front width', valueM: modifier.sizeM, toPatch: (m) => set({ sizeM: m }) }
	];
	if (modifier.emitterShape === 'rectangle') {
		out.push({ type: 'length', key: 'modifierHeightM', label: 'Front height', valueM: modifier.heightM ?? modifier.sizeM, toPatch: (m) => set({ heightM: m }) });
	}
	return out;
}

function emitterFields(el: Extract<EditorElement, { kind: 'flash' | 'continuous' }>, shelfFlash: ShelfGear<'flash'> | undefined): InspectorField[] {
	const out: InspectorField[] = [];
	if (el.kind === 'flash') {
		const guideNumber: InspectorField = {
			...numberField('guideNumber', 'Guide number (m, ISO 100, full power)', el.guideNumber),
			// A guide number typed by hand is no longer the shelf flash's.
			read: (t) => {
				const r = number('guideNumber', t);
				return r.ok && el.gearId ? { ok: true, patch: { ...r.patch, gearId: undefined } } : r;
			}
		} as InspectorField;
		out.push(guideNumber, powerField(el.power), powerField(el.lowestPower, 'lowestPower', 'Lowest power (its last step)', 'e.g. 1/128; the power ladder ends there'), zoomField(el, shelfFlash));
	} else {
		out.push(numberField('luxAt1m', 'Output (lux at 1 m)', el.luxAt1m));
	}
	if (el.modifier) {
		const modifier = el.modifier;
		out.push({
			type: 'text',
			key: 'modifier',
			label: `Beam angle of “${modifier.name}” (°)`,
			text: modifier.beamAngleDeg === null ? '' : String(Math.round(modifier.beamAngleDeg)),
			hint: 'empty: spreads evenly',
			read: (t) => {
				if (t.trim() === '') return { ok: true, patch: { modifier: { ...modifier, beamAngleDeg: null } } };
				const n = plainNumber(t);
				return n === null ? { ok: false, message: 'must be a number' } : { ok: true, patch: { modifier: { ...modifier, beamAngleDeg: n } } };
			}
		}, ...modifierFrontFields(modifier));
	}
	out.push(kelvinField(el.kelvin), numberField('gelMired', 'Gel (mired, + warmer)', el.gelMired), numberField('otherLossStops', 'Other losses (stops)', el.otherLossStops), angleField('tiltDeg', 'Tilt (°, up +)', el.tiltDeg));
	if (el.kind === 'continuous') out.push({ type: 'toggle', key: 'runsHot', label: 'Runs hot (tungsten, halogen)', checked: el.runsHot });
	else out.push({ type: 'toggle', key: 'mainsPowered', label: 'Mains powered (studio strobe)', checked: el.mainsPowered });
	return out;
}

const FINISH_CUSTOM = 'custom';

function panelFields(el: Extract<EditorElement, { kind: 'reflector' | 'diffuser' | 'flag' }>): InspectorField[] {
	const out: InspectorField[] = [
		{ type: 'length', key: 'widthM', label: 'Width', valueM: el.widthM },
		{ type: 'length', key: 'panelHeightM', label: 'Height (upright)', valueM: el.panelHeightM },
		angleField('tiltDeg', 'Tilt (°, up +)', el.tiltDeg)
	];
	if (el.kind === 'reflector') {
		const finish = finishOf(el);
		out.push(
			{
				type: 'select',
				key: 'finish',
				label: 'Surface',
				value: finish ?? FINISH_CUSTOM,
				options: [
					...(Object.keys(REFLECTOR_FINISHES) as ReflectorFinish[]).map((f) => ({
						value: f,
						label: `${REFLECTOR_FINISHES[f].label} (${Math.round(REFLECTOR_FINISHES[f].reflectance * 100)} %, ${REFLECTOR_FINISHES[f].surface})`
					})),
					...(finish ? [] : [{ value: FINISH_CUSTOM, label: 'As measured or typed' }])
				],
				choose: (v) => (v === FINISH_CUSTOM ? {} : { surface: REFLECTOR_FINISHES[v as ReflectorFinish].surface, reflectance: REFLECTOR_FINISHES[v as ReflectorFinish].reflectance })
			},
			{ type: 'text', key: 'reflectance', label: 'Reflectance (%)', text: shown(el.reflectance * 100), read: (t) => number('reflectance', t, (n) => n / 100) },
			{
				type: 'select',
				key: 'surface',
				label: 'Reflects',
				value: el.surface,
				options: [
					{ value: 'diffuse', label: 'Diffuse (a card: spreads the light)' },
					{ value: 'specular', label: 'Specular (a mirror-like face)' }
				],
				choose: (v) => ({ surface: v })
			}
		);
	}
	if (el.kind === 'diffuser') out.push(numberField('lossStops', 'Light loss (stops)', el.lossStops));
	return out;
}

function ambientFields(el: Extract<EditorElement, { kind: 'ambient' }>): InspectorField[] {
	const preset = skyPresetOf(el.ev100);
	return [
		{
			type: 'select',
			key: 'source',
			label: 'Light from',
			value: el.source,
			options: [
				{ value: 'window', label: 'A window' },
				{ value: 'sky', label: 'Open sky' }
			],
			choose: (v) => ({ source: v })
		},
		{
			type: 'select',
			key: 'skyPreset',
			label: 'Sky',
			value: preset ?? '',
			options: [...(preset ? [] : [{ value: '', label: 'Metered (EV typed)' }]), ...SKY_PRESET_NAMES.map((p) => ({ value: p, label: `${SKY_PRESETS[p].label} (EV ${SKY_PRESETS[p].ev100})` }))],
			choose: (v) => (v ? { ev100: SKY_PRESETS[v as keyof typeof SKY_PRESETS].ev100 } : {})
		},
		{ type: 'text', key: 'ev100', label: 'EV at ISO 100', text: String(Math.round(el.ev100 * 10) / 10), read: (t) => number('ev100', t), hint: 'from a meter, or a sky preset' },
		kelvinField(el.kelvin),
		{ type: 'length', key: 'widthM', label: 'Width', valueM: el.widthM }
	];
}

function cameraFields(el: Extract<EditorElement, { kind: 'camera' }>): InspectorField[] {
	return [
		numberField('focalLengthMm', 'Focal length (mm)', el.focalLengthMm),
		numberField('sensorWidthMm', 'Sensor width (mm)', el.sensorWidthMm),
		numberField('sensorHeightMm', 'Sensor height (mm)', el.sensorHeightMm)
	];
}

const FACING_DIRECTION = 'direction';

/**
 * The subject's face: toward the camera, up (a face-up specimen, a section) or a direction set here
 * (its normal, as an angle on the plan and a tilt). Lambert's cosine law at the subject follows it.
 */
function subjectFacingFields(el: Extract<EditorElement, { kind: 'subject' }>): InspectorField[] {
	const normal = el.normal;
	const out: InspectorField[] = [
		{
			type: 'select',
			key: 'facing',
			label: 'Its face looks',
			value: normal ? FACING_DIRECTION : el.facing,
			options: [
				{ value: 'camera', label: 'Toward the camera' },
				{ value: 'up', label: 'Up (a face-up specimen, a section)' },
				{ value: FACING_DIRECTION, label: 'A direction (set below)' }
			],
			choose: (v) => (v === FACING_DIRECTION ? { normal: normal ?? direction3(el.rotationDeg, 0) } : { facing: v, normal: undefined })
		}
	];
	if (normal) {
		const angles = aimAngles([0, 0, 0], normal);
		const toNormal = (rotationDeg: number, tiltDeg: number) => ({ normal: direction3(rotationDeg, tiltDeg).map((v) => Math.round(v * 1e12) / 1e12) });
		out.push(
			{ type: 'text', key: 'faceRotationDeg', label: 'Face turned toward (°, clockwise from right)', text: String(Math.round(angles.rotationDeg)), read: (t) => readAngle(t, 360, (n) => toNormal(n, angles.tiltDeg)) },
			{ type: 'text', key: 'faceTiltDeg', label: 'Face tilt (°, up +)', text: String(Math.round(angles.tiltDeg)), read: (t) => readAngle(t, 90, (n) => toNormal(angles.rotationDeg, n)) }
		);
	}
	return out;
}

/** A typed angle within ±`limitDeg`, made into a patch. */
function readAngle(text: string, limitDeg: number, toPatch: (deg: number) => Patch): Reading {
	const n = plainNumber(text);
	if (n === null) return { ok: false, message: 'must be a number' };
	if (Math.abs(n) > limitDeg) return { ok: false, message: `must be from −${limitDeg}° to ${limitDeg}°` };
	return { ok: true, patch: toPatch(n) };
}

/** What the inspector knows beside the element: the shelf flash it came from (for its zoom positions). */
export interface FieldContext {
	shelfFlash?: ShelfGear<'flash'>;
}

/** Every field of the element, in the order the inspector shows them (label and height come first, always). */
export function inspectorFields(el: EditorElement, context: FieldContext = {}): InspectorField[] {
	const facing = el.kind === 'ambient' ? 'Light travels toward (°, clockwise from right)' : 'Facing (°, clockwise from right)';
	const common: InspectorField[] = [
		{ type: 'length', key: 'heightM', label: el.kind === 'ambient' ? 'Height of the window’s middle' : 'Height above the table', valueM: el.heightM }
	];
	if (el.kind !== 'subject' && el.kind !== 'background') common.push(angleField('rotationDeg', facing, el.rotationDeg));
	switch (el.kind) {
		case 'flash':
		case 'continuous':
			return [...common, ...emitterFields(el, context.shelfFlash)];
		case 'reflector':
		case 'diffuser':
		case 'flag':
			return [...common, ...panelFields(el)];
		case 'ambient':
			return [...common, ...ambientFields(el)];
		case 'camera':
			return [...common, ...cameraFields(el)];
		case 'subject':
			return [
				...common,
				{ type: 'length', key: 'widthM', label: 'Width', valueM: el.widthM },
				{ type: 'length', key: 'depthM', label: 'Depth (front to back)', valueM: el.depthM },
				...subjectFacingFields(el),
				{ type: 'toggle', key: 'living', label: 'A person or an animal', checked: el.living }
			];
		case 'background':
			return [...common, { type: 'length', key: 'widthM', label: 'Width', valueM: el.widthM }, { type: 'length', key: 'depthM', label: 'Depth', valueM: el.depthM }];
	}
}
