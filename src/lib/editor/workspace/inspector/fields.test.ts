import { describe, expect, it } from 'vitest';
import { addElement, setAmbient, setElementProperties } from '../../commands';
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
});
