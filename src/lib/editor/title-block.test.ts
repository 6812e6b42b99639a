import { describe, expect, it } from 'vitest';
import { cameraLine, lightLine, lightRows, planNames } from './title-block';
import type { ExposureScene } from '$lib/light/schema';

const scene: ExposureScene = {
	camera: { iso: 100, aperture: 16, shutter: 1 / 160, magnification: 0.5 },
	subject: { position: [0, 0, 0.05] },
	lights: [
		{ id: 'key', kind: 'flash', position: [0.3, 0, 0.45], guideNumber: 40, power: 0.125 * 2 ** (1 / 3) },
		{ id: 'card', kind: 'reflector', position: [-0.2, 0, 0.05], areaM2: 0.04, reflectance: 0.8, surface: 'diffuse', source: 'key' }
	]
} as ExposureScene;

describe('the title block and the sheet’s light table', () => {
	it('names each light with its power in the trade’s notation, guide number, modifier, true distance and height', () => {
		const rows = lightRows(scene, { key: { label: 'Key flash', modifier: { name: 'Small softbox' } } }, 'metric');
		expect(rows[0]).toMatchObject({ name: 'Key flash', power: '1/8 +0.3', guideNumber: '40 (m)', modifier: 'Small softbox' });
		// √(0.3² + 0.4²) = 0.5 m: the 3-D distance, not the plan's 30 cm.
		expect(rows[0].distance).toBe('50 cm');
		expect(rows[0].height).toBe('45 cm');
		expect(rows[1]).toMatchObject({ name: 'card', power: 'reflects 80 %', guideNumber: null, modifier: null });
		expect(lightLine(rows[0])).toBe('Key flash: flash 1/8 +0.3, GN 40 (m), Small softbox, 50 cm away, 45 cm high');
	});
	it('writes the camera settings on one line', () => {
		expect(cameraLine(scene.camera)).toBe('ISO 100 · f/16 · 1/160 s · 0.5× (1:2)');
	});
	it('reads a stored plan’s modifier from the light or from a modifier or diffuser fitted to it', () => {
		const names = planNames({
			elements: {
				key: { kind: 'flash', label: 'Key' },
				box: { kind: 'modifier', label: 'Larkspur 30 cm softbox', attachedTo: 'key' },
				fill: { kind: 'flash', label: 'Fill', modifier: { name: 'Opal dome' } },
				card: { kind: 'reflector', label: 'White card' }
			}
		});
		expect(names.key?.modifier?.name).toBe('Larkspur 30 cm softbox');
		expect(names.fill?.modifier?.name).toBe('Opal dome');
		expect(names.card?.modifier).toBeNull();
		expect(lightRows(scene, names, 'metric')[0].modifier).toBe('Larkspur 30 cm softbox');
	});
});
