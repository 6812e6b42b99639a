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
import { formatPower, parsePower } from '../../model/power-notation';
import type { EditorElement, ReflectorFinish } from '../../model/schema';

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
	| (Common & { type: 'length'; valueM: number; key: string })
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

function powerField(power: number): InspectorField {
	return {
		type: 'text',
		key: 'power',
		label: 'Power',
		text: formatPower(power),
		hint: POWER_FIELD_HINT,
		read: (t) => {
			const r = parsePower(t);
			return r.ok ? { ok: true, patch: { power: r.power } } : { ok: false, message: r.message };
		}
	};
}

function emitterFields(el: Extract<EditorElement, { kind: 'flash' | 'continuous' }>): InspectorField[] {
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
		out.push(guideNumber, powerField(el.power), {
			type: 'text',
			key: 'zoomMm',
			label: 'Zoom head (mm)',
			text: el.zoomMm === null ? '' : shown(el.zoomMm),
			read: (t) => optionalNumber('zoomMm', t),
			hint: 'empty: no zoom head'
		});
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
		});
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

/** Every field of the element, in the order the inspector shows them (label and height come first, always). */
export function inspectorFields(el: EditorElement): InspectorField[] {
	const facing = el.kind === 'ambient' ? 'Light travels toward (°, clockwise from right)' : 'Facing (°, clockwise from right)';
	const common: InspectorField[] = [
		{ type: 'length', key: 'heightM', label: el.kind === 'ambient' ? 'Height of the window’s middle' : 'Height above the table', valueM: el.heightM }
	];
	if (el.kind !== 'subject' && el.kind !== 'background') common.push(angleField('rotationDeg', facing, el.rotationDeg));
	switch (el.kind) {
		case 'flash':
		case 'continuous':
			return [...common, ...emitterFields(el)];
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
				{ type: 'length', key: 'depthM', label: 'Depth', valueM: el.depthM },
				{ type: 'toggle', key: 'living', label: 'A person or an animal', checked: el.living }
			];
		case 'background':
			return [...common, { type: 'length', key: 'widthM', label: 'Width', valueM: el.widthM }, { type: 'length', key: 'depthM', label: 'Depth', valueM: el.depthM }];
	}
}
