import { describe, expect, it } from 'vitest';
import { addElement } from '../../commands';
import { setAmbient, setElementProperties } from '../../commands-properties';
import { MODIFIER_PRESETS } from '../../model/defaults';
import { commandSession } from '../../test-fixtures';
import { inspectorFields, type InspectorField } from './fields';

const byKey = (fields: InspectorField[], key: string) => fields.find((f) => f.key === key)!;
const textOf = (f: InspectorField) => (f.type === 'text' ? f.text : null);
const read = (f: InspectorField, t: string) => (f.type === 'text' ? f.read(t) : null);

describe('inspector fields', () => {
	it('a flash shows its power in the trade’s notation and angles to 1°; typed power reads back', () => {
		const s = commandSession();
		s.run(setElementProperties('key', { rotationDeg: -33.69006752597979, power: 2 ** (-3 + 1 / 3) }));
		const fields = inspectorFields(s.model.elements.key);
		expect(textOf(byKey(fields, 'power'))).toBe('1/8 +0.3');
		expect(textOf(byKey(fields, 'rotationDeg'))).toBe('-34');
		expect(read(byKey(fields, 'power'), '1/32')).toEqual({ ok: true, patch: { power: 1 / 32 } });
		expect(read(byKey(fields, 'power'), 'lots')).toMatchObject({ ok: false, message: expect.stringMatching(/1\/32/) });
		expect(read(byKey(fields, 'guideNumber'), 'forty')).toEqual({ ok: false, message: 'must be a number' });
	});

	it('a typed guide number lets go of the shelf flash it came from', () => {
		const s = commandSession();
		s.run(setElementProperties('key', { gearId: '7e1a9b30-4c2d-4f1e-9a0b-00000000a001' }));
		expect(read(byKey(inspectorFields(s.model.elements.key), 'guideNumber'), '32')).toEqual({ ok: true, patch: { guideNumber: 32, gearId: undefined } });
	});

	it('a reflector offers its finish, reflectance in per cent and surface; the ambient its source, sky preset and EV', () => {
		const s = commandSession();
		s.run(addElement('reflector', { xM: 0.3, yM: 0 }));
		const card = inspectorFields(s.model.elements['reflector-1']);
		const finish = byKey(card, 'finish');
		expect(finish.type === 'select' && finish.value).toBe('white');
		expect(finish.type === 'select' && finish.choose('gold')).toEqual({ surface: 'specular', reflectance: 0.75 });
		expect(read(byKey(card, 'reflectance'), '60')).toEqual({ ok: true, patch: { reflectance: 0.6 } });
		expect(card.map((f) => f.key)).toEqual(expect.arrayContaining(['widthM', 'panelHeightM', 'tiltDeg', 'surface']));
		s.run(setAmbient({ ev100: 11.5 }));
		const amb = inspectorFields(Object.values(s.model.elements).find((e) => e.kind === 'ambient')!);
		const preset = byKey(amb, 'skyPreset');
		expect(preset.type === 'select' && preset.value).toBe('');
		expect(preset.type === 'select' && preset.choose('open-shade')).toEqual({ ev100: 11 });
		expect(textOf(byKey(amb, 'ev100'))).toBe('11.5');
		expect(read(byKey(amb, 'kelvin'), '')).toEqual({ ok: true, patch: { kelvin: null } });
	});

	it('a subject’s face looks toward the camera, up, or a direction typed as an angle and a tilt', () => {
		const s = commandSession();
		const subject = () => Object.values(s.model.elements).find((e) => e.kind === 'subject')!;
		const facing = byKey(inspectorFields(subject()), 'facing');
		// The test fixture's quartz has its face turned to the key (a normal): a direction.
		expect(facing.type === 'select' && facing.value).toBe('direction');
		expect(facing.type === 'select' && facing.choose('up')).toEqual({ facing: 'up', normal: undefined });
		s.run(setElementProperties(subject().id, { facing: 'up', normal: undefined }));
		const up = inspectorFields(subject());
		expect(up.map((f) => f.key)).not.toContain('faceRotationDeg');
		const choose = byKey(up, 'facing');
		const patch = choose.type === 'select' ? choose.choose('direction') : {};
		s.run(setElementProperties(subject().id, patch));
		expect(subject().normal).toBeDefined();
		const turned = read(byKey(inspectorFields(subject()), 'faceRotationDeg'), '180');
		expect(turned?.ok && (turned.patch.normal as number[]).map((v) => Math.round(v * 1e9) / 1e9 + 0)).toEqual([-1, 0, 0]);
		expect(read(byKey(inspectorFields(subject()), 'faceTiltDeg'), '95')).toEqual({ ok: false, message: 'must be from −90° to 90°' });
		expect(byKey(inspectorFields(subject()), 'depthM').label).toBe('Depth (front to back)');
	});

	it('a flash’s lowest power reads as power is written; the zoom offers the shelf flash’s positions with their guide numbers', () => {
		const s = commandSession();
		expect(read(byKey(inspectorFields(s.model.elements.key), 'lowestPower'), '1/128')).toEqual({ ok: true, patch: { lowestPower: 1 / 128 } });
		const shelfFlash = {
			id: '7e1a9b30-4c2d-4f1e-9a0b-00000000a001',
			name: 'Kestrel 40',
			spec: {
				guideNumberM: 40,
				lowestPower: 1 / 128,
				syncSpeedS: 1 / 200,
				calibrationOffsetStops: 0,
				mainsPowered: false,
				zoomMm: 35,
				guideNumbersByZoom: [
					{ zoomMm: 105, guideNumberM: 58 },
					{ zoomMm: 24, guideNumberM: 28 },
					{ zoomMm: 35, guideNumberM: 40 }
				]
			}
		};
		// Typed by hand: the zoom is typed too.
		expect(byKey(inspectorFields(s.model.elements.key, { shelfFlash }), 'zoomMm').type).toBe('text');
		s.run(setElementProperties('key', { gearId: shelfFlash.id, zoomMm: 35 }));
		const zoom = byKey(inspectorFields(s.model.elements.key, { shelfFlash }), 'zoomMm');
		expect(zoom.type === 'select' && zoom.options.map((o) => o.label)).toEqual(['24 mm (GN 28)', '35 mm (GN 40)', '105 mm (GN 58)']);
		expect(zoom.type === 'select' && zoom.choose('24')).toEqual({ zoomMm: 24, guideNumber: 28 });
	});

	it('a modifier’s front is a point, or a rectangle or disc its size that glows evenly', () => {
		const s = commandSession();
		s.run(setElementProperties('key', { modifier: MODIFIER_PRESETS[0] }));
		const front = byKey(inspectorFields(s.model.elements.key), 'emitterShape');
		expect(front.type === 'select' && front.value).toBe('point');
		const disc = front.type === 'select' ? front.choose('disc') : {};
		expect(disc).toMatchObject({ modifier: { emitterShape: 'disc' } });
		s.run(setElementProperties('key', disc));
		const fields = inspectorFields(s.model.elements.key);
		const size = byKey(fields, 'modifierSizeM');
		expect(size.label).toBe('Front diameter');
		expect(fields.map((f) => f.key)).not.toContain('modifierHeightM');
		expect(size.type === 'length' && size.toPatch?.(0.12)).toMatchObject({ modifier: { emitterShape: 'disc', sizeM: 0.12 } });
		const rect = byKey(fields, 'emitterShape');
		s.run(setElementProperties('key', rect.type === 'select' ? rect.choose('rectangle') : {}));
		const height = byKey(inspectorFields(s.model.elements.key), 'modifierHeightM');
		expect(height.type === 'length' && height.toPatch?.(0.2)).toMatchObject({ modifier: { emitterShape: 'rectangle', heightM: 0.2 } });
		// Back to a point: the size stays for the drawing, the shape goes.
		const point = byKey(inspectorFields(s.model.elements.key), 'emitterShape');
		const patch = point.type === 'select' ? point.choose('point') : {};
		expect(patch.modifier).not.toHaveProperty('emitterShape');
	});
});
