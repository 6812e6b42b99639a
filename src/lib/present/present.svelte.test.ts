import { describe, expect, it } from 'vitest';
import { setElementProperties } from '$lib/editor/commands-properties';
import { Presentation, type PresentStep } from './present.svelte';
import type { ExposureScene } from '$lib/light/schema';

const scene: ExposureScene = {
	camera: { iso: 200, aperture: 16, shutter: 1 / 200, magnification: 0.4 },
	subject: { position: [0, 0, 0.04] },
	lights: [
		{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 28, power: 0.25, aim: [0, 0, 0.04], beamAngleDeg: 90, kelvin: 5600 },
		{ id: 'card', kind: 'reflector', position: [0.15, -0.05, 0.08], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'key' }
	]
};
const step = (id: string, visibleIds: string[] | null, caption: string): PresentStep => ({
	id,
	caption,
	setupId: 'quartz',
	setupTitle: 'Quartz cluster',
	revisionNumber: 3,
	document: { scene, plan: {} },
	visibleIds
});
const lesson = () => [step('s1', ['key'], 'The key light alone'), step('s2', ['key', 'card'], 'Add the card'), step('s3', null, 'Everything')];

const total = (p: Presentation) => (p.editor.exposure.ok ? p.editor.exposure.result.total.x : NaN);
/** What the shadow face gets: a card opposite the key fills that face (faces.ts), not the one the key lights. */
const shadow = (p: Presentation) => (p.editor.exposure.ok ? (p.editor.exposure.result.faces?.shadow.x ?? NaN) : NaN);

describe('presenting a lesson', () => {
	it('moves through the steps with the keys, holding at both ends, and tells the page', () => {
		const seen: number[] = [];
		const p = new Presentation(lesson(), { onstep: (i) => seen.push(i) });
		expect(p.step?.caption).toBe('The key light alone');
		expect(p.act('previous')).toBe(false);
		p.act('next');
		p.act('next');
		expect(p.act('next')).toBe(false);
		p.act('first');
		p.act('last');
		expect(seen).toEqual([1, 2, 0, 2]);
		expect(p.nextStep).toBeUndefined();
	});

	it('shows each step’s lights only, and the exposure follows them (the card fills the shadow side)', () => {
		const p = new Presentation(lesson());
		expect(p.editor.scene.lights.map((l) => l.id)).toEqual(['key']);
		const keyAlone = shadow(p);
		p.act('next');
		expect(p.editor.scene.lights.map((l) => l.id).sort()).toEqual(['card', 'key']);
		expect(shadow(p)).toBeGreaterThan(keyAlone);
	});

	it('blanks and unblanks with B', () => {
		const p = new Presentation(lesson());
		p.act('blank');
		expect(p.blank).toBe(true);
		p.act('blank');
		expect(p.blank).toBe(false);
	});

	it('keeps a what-if on the step until the step changes, and can keep it as a document', () => {
		const p = new Presentation(lesson());
		const before = total(p);
		const result = p.editor.execute(setElementProperties('key', { power: 0.5 }));
		expect(result.ok).toBe(true);
		expect(p.whatIfChanged).toBe(true);
		// Twice the power: one stop more (inverse-square flash exposure, X ∝ power; common practice).
		expect(Math.log2(total(p) / before)).toBeCloseTo(1, 5);
		const kept = p.keptDocument()!;
		expect(kept.scene.lights.map((l) => l.id).sort()).toEqual(['card', 'key']);
		expect(kept.scene.lights.find((l) => l.id === 'key')!.kind === 'flash' && kept.scene.lights.find((l) => l.id === 'key')).toMatchObject({ power: 0.5 });
		p.act('next');
		p.act('previous');
		expect(p.whatIfChanged).toBe(false);
		expect(total(p)).toBeCloseTo(before, 10);
	});
});
