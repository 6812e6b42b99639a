// Commands that describe elements fully: the ambient light, gear from the shelf and the power needed.
import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { addElement, duplicateElements, removeElements } from './commands';
import { setAmbient, setElementProperties } from './commands-properties';
import { setPowerToNeeded, takeCameraFromShelf, takeFlashFromShelf, takeLensFromShelf } from './commands-gear';
import { REFLECTOR_FINISHES } from './model/defaults';
import { powerNeeded } from './model/power-needed';
import { toExposureScene } from './model/scene';
import { shelfGear, type ShelfItem } from './model/shelf';
import { ambientOf, type EditorModel } from './model/types';
import { addWith, commandSession } from './test-fixtures';
import { finishOf } from './workspace/inspector/fields';

const exposureOf = (m: EditorModel) => computeExposure(toExposureScene(m));

const SHELF: ShelfItem[] = [
	{ id: '7e1a9b30-4c2d-4f1e-9a0b-00000000a001', kind: 'flash', name: 'Test flash 40', spec: { guideNumberM: 40, lowestPower: 1 / 64, syncSpeedS: 1 / 250, calibrationOffsetStops: -1, zoomMm: 35, kelvin: 5600 } },
	{ id: '7e1a9b30-4c2d-4f1e-9a0b-00000000e001', kind: 'camera', name: 'Test body', spec: { sensorWidthMm: 23.5, sensorHeightMm: 15.6, cocMm: 0.02, syncSpeedS: 1 / 250 } },
	{ id: '7e1a9b30-4c2d-4f1e-9a0b-00000000d001', kind: 'lens', name: 'Test 60 mm macro', spec: { focalLengthMm: 60, maxMagnification: 1, pupilMagnification: 0.7, widestAperture: 2.8, narrowestAperture: 22 } },
	{ id: '7e1a9b30-4c2d-4f1e-9a0b-00000000a003', kind: 'flash', name: 'Retired flash', spec: { guideNumberM: 36, lowestPower: 1 / 64, syncSpeedS: 1 / 200 }, retiredAt: '2026-10-01T00:00:00Z' },
	{ id: '7e1a9b30-4c2d-4f1e-9a0b-00000000b001', kind: 'modifier', name: 'A softbox', spec: { shape: 'softbox', lossStops: 1, beamAngleDeg: 90 } }
];
const gear = shelfGear(SHELF);

describe('the ambient light', () => {
	it('is placed, one a plan, fed to the scene as its ambient, and removed with undo', () => {
		const s = commandSession();
		const r = s.run(addElement('ambient', { xM: 0, yM: -0.5 }));
		expect(r.ok).toBe(true);
		const amb = ambientOf(s.model)!;
		expect(amb).toMatchObject({ kind: 'ambient', source: 'window', ev100: 13, kelvin: 6500 });
		expect(toExposureScene(s.model).ambient).toEqual({ ev100: 13, kelvin: 6500 });
		const again = s.run(addElement('ambient', { xM: 0.2, yM: -0.5 }));
		expect(!again.ok && again.error.message).toMatch(/already has an ambient light/);
		const copy = s.run(duplicateElements([amb.id]));
		expect(copy.ok).toBe(false);
		s.run(setElementProperties(amb.id, { ev100: 9, kelvin: null, source: 'sky' }));
		expect(toExposureScene(s.model).ambient).toEqual({ ev100: 9 });
		const bad = s.run(setElementProperties(amb.id, { ev100: 99 }));
		expect(!bad.ok && bad.error.path).toEqual(['ev100']);
		s.run(removeElements([amb.id]));
		expect(toExposureScene(s.model).ambient).toBeUndefined();
		s.undo();
		expect(toExposureScene(s.model).ambient).toEqual({ ev100: 9 });
		s.undo();
		s.undo();
		expect(ambientOf(s.model)).toBeUndefined();
	});

	it('setAmbient sets the element that is there, or puts open sky behind the subject; null removes it', () => {
		const s = commandSession();
		s.run(setAmbient({ ev100: 11, kelvin: 7000 }));
		const placed = ambientOf(s.model)!;
		expect(placed).toMatchObject({ source: 'sky', ev100: 11, kelvin: 7000, xM: 0, yM: -0.4 });
		s.run(setAmbient({ ev100: 12 }));
		expect(ambientOf(s.model)).toMatchObject({ id: placed.id, ev100: 12, kelvin: null });
		const bad = s.run(setAmbient({ ev100: Number.NaN }));
		expect(!bad.ok && bad.error.path).toEqual(['ambient', 'ev100']);
		s.run(setAmbient(null));
		expect(ambientOf(s.model)).toBeUndefined();
	});
});

describe('set to the power needed', () => {
	it('one flash: the nearest third-stop step, the setup within a sixth of a stop of correct', () => {
		const s = commandSession();
		// Quartz: GN 40 at 50 cm, f/16 at 1:2 (working f/24): (24 × 0.5 / 40)² = 0.09 of full power.
		const needed = powerNeeded(s.model, 'key');
		expect(needed.ok && needed.required).toBeCloseTo(0.09, 10);
		expect(needed.ok && needed.step.label).toBe('1/16 +0.7');
		expect(s.run(setPowerToNeeded('key')).ok).toBe(true);
		expect(s.model.elements.key).toMatchObject({ power: 2 ** (-10 / 3) });
		const offset = exposureOf(s.model).total.exposureOffsetStops!;
		expect(Math.abs(offset)).toBeLessThanOrEqual(1 / 6 + 1e-9);
		expect(needed.ok && needed.residualStops).toBeCloseTo(offset, 10);
		s.undo();
		expect(s.model.elements.key).toMatchObject({ power: 1 / 8 });
	});

	it('counts the ambient and stops at the flash’s lowest step, showing what is left', () => {
		const s = commandSession();
		s.run(setAmbient({ ev100: 12 }));
		s.run(setElementProperties('key', { lowestPower: 1 / 64 }));
		// Ambient alone at EV 12, ISO 100, 1/160 s, working f/24: 2^12 / 160 / 24² = 0.044; the flash adds the rest.
		s.run(setPowerToNeeded('key'));
		expect(Math.abs(exposureOf(s.model).total.exposureOffsetStops!)).toBeLessThanOrEqual(1 / 6 + 1e-9);
		s.run(setElementProperties('key', { xM: -0.05 }));
		const close = powerNeeded(s.model, 'key');
		expect(close.ok && close.step.label).toBe('1/64');
		expect(close.ok && close.withinRange).toBe(false);
		expect(close.ok && close.residualStops).toBeGreaterThan(1);
	});

	it('refuses for a flash that gives the subject no light, naming the power field', () => {
		const s = commandSession();
		s.run(addWith('flag', { xM: -0.25, yM: 0 }, { rotationDeg: 0, widthM: 0.4 }));
		const r = s.run(setPowerToNeeded('key'));
		expect(!r.ok && r.error).toMatchObject({ path: ['power'] });
		expect(!r.ok && r.error.message).toMatch(/no light/);
	});
});

describe('gear from the shelf', () => {
	it('lists the flashes, bodies and lenses in use (not retired ones, not other kinds)', () => {
		expect(gear.flashes.map((f) => f.name)).toEqual(['Test flash 40']);
		expect(gear.cameras).toHaveLength(1);
		expect(gear.lenses).toHaveLength(1);
	});

	it('a shelf flash gives its guide number with its calibration beside it, ladder, zoom and kelvin; null keeps the figures, typed', () => {
		const s = commandSession();
		s.run(setElementProperties('key', { power: 1 / 128 }));
		const uncalibrated = exposureOf(s.model).total.exposureOffsetStops!;
		expect(s.run(takeFlashFromShelf('key', gear.flashes[0])).ok).toBe(true);
		// The rated guide number stays as the shelf says; the calibration is the scene's offset, not baked in.
		expect(s.model.elements.key).toMatchObject({ guideNumber: 40, calibrationOffsetStops: -1, lowestPower: 1 / 64, zoomMm: 35, kelvin: 5600, gearId: gear.flashes[0].id, power: 1 / 64 });
		expect(toExposureScene(s.model).lights[0]).toMatchObject({ guideNumber: 40, calibrationOffsetStops: -1 });
		// The power rises to the flash's lowest step (1/128 to 1/64: one stop up) and the calibration, applied
		// once, takes one stop (exposure goes with GN², so −1 stop is GN × 2^(−1/2)).
		expect(exposureOf(s.model).total.exposureOffsetStops! - uncalibrated).toBeCloseTo(Math.log2((1 / 64) / (1 / 128)) - 1, 9);
		s.run(takeFlashFromShelf('key', null));
		expect(s.model.elements.key).toMatchObject({ guideNumber: 40, calibrationOffsetStops: -1 });
		expect((s.model.elements.key as { gearId?: string }).gearId).toBeUndefined();
		// A figure the element cannot take is refused, naming it (the shelf's spec is not trusted blindly).
		const odd = { ...gear.flashes[0], spec: { ...gear.flashes[0].spec, guideNumberM: -3 } };
		const refused = s.run(takeFlashFromShelf('key', odd));
		expect(!refused.ok && refused.error.path).toEqual(['guideNumber']);
		s.undo();
		s.undo();
		expect(s.model.elements.key).toMatchObject({ guideNumber: 40, calibrationOffsetStops: 0, power: 1 / 128 });
		expect((s.model.elements.key as { gearId?: string }).gearId).toBeUndefined();
	});

	it('a camera body and a lens each change the element and the camera settings in one undo step', () => {
		const s = commandSession();
		const cameraId = Object.values(s.model.elements).find((e) => e.kind === 'camera')!.id;
		s.run(takeCameraFromShelf(cameraId, gear.cameras[0]));
		s.run(takeLensFromShelf(cameraId, gear.lenses[0]));
		expect(s.model.elements[cameraId]).toMatchObject({ sensorWidthMm: 23.5, focalLengthMm: 60, gearId: gear.cameras[0].id, lens: { name: 'Test 60 mm macro' } });
		expect(s.model.camera).toMatchObject({ cocMm: 0.02, syncSpeed: 1 / 250, pupilMagnification: 0.7, minAperture: 2.8, maxAperture: 22 });
		s.undo();
		expect(s.model.elements[cameraId]).toMatchObject({ focalLengthMm: 100, lens: null });
		expect(s.model.camera.pupilMagnification).toBeUndefined();
		expect(s.model.camera.cocMm).toBe(0.02);
		const notCamera = s.run(takeLensFromShelf('key', gear.lenses[0]));
		expect(notCamera.ok).toBe(false);
	});
});

describe('element properties', () => {
	it('a reflector’s finish is its surface and reflectance (from memory: white, silver, gold, black)', () => {
		const s = commandSession();
		s.run(addElement('reflector', { xM: 0.3, yM: 0 }));
		expect(finishOf(s.model.elements['reflector-1'] as { surface: 'diffuse'; reflectance: number })).toBe('white');
		const { surface, reflectance } = REFLECTOR_FINISHES.silver;
		s.run(setElementProperties('reflector-1', { surface, reflectance, widthM: 0.3, panelHeightM: 0.4 }));
		const card = s.model.elements['reflector-1'];
		expect(card.kind === 'reflector' && finishOf(card)).toBe('silver');
		expect(toExposureScene(s.model).lights.find((l) => l.id === 'reflector-1')).toMatchObject({ areaM2: 0.3 * 0.4, reflectance: 0.9, surface: 'specular' });
		const bad = s.run(setElementProperties('reflector-1', { widthM: 0 }));
		expect(!bad.ok && bad.error.path).toEqual(['widthM']);
	});

	it('a power above full is refused naming the field, and the model keeps its power', () => {
		const s = commandSession();
		const r = s.run(setElementProperties('key', { power: 2 }));
		expect(!r.ok && r.error).toMatchObject({ path: ['power'], message: expect.stringMatching(/at most 1/) });
		expect(s.model.elements.key).toMatchObject({ power: 1 / 8 });
	});
});
