import { describe, expect, it } from 'vitest';
import { referencedGearIds } from '$lib/scene/document';
import { modifierFromShelf, shelfModifiers } from './shelf';

const SOFTBOX = { id: '7d0f7c39-2a1e-4c55-9a40-4f5b3c2d1e01', kind: 'modifier', name: 'Larkspur 30 cm softbox', spec: { shape: 'softbox', lossStops: 1.7, beamAngleDeg: 90, widthM: 0.3 } };

describe('gear-shelf modifiers in the editor', () => {
	it('carry the shelf figures and the gear id', () => {
		expect(modifierFromShelf(SOFTBOX)).toEqual({ name: 'Larkspur 30 cm softbox', beamAngleDeg: 90, lossStops: 1.7, sizeM: 0.3, emitterShape: 'rectangle', gearId: SOFTBOX.id });
	});

	it('a softbox or a panel glows as a rectangle its size, a dome or an umbrella as a disc; a snoot is a point', () => {
		const panel = { ...SOFTBOX, spec: { shape: 'diffusion panel', lossStops: 1, beamAngleDeg: 120, widthM: 0.6, heightM: 0.4 } };
		expect(modifierFromShelf(panel)).toMatchObject({ emitterShape: 'rectangle', sizeM: 0.6, heightM: 0.4 });
		const dome = { ...SOFTBOX, spec: { shape: 'dome', lossStops: 1.5, beamAngleDeg: 150 } };
		expect(modifierFromShelf(dome)).toMatchObject({ emitterShape: 'disc', sizeM: 0.08 });
		const snoot = { ...SOFTBOX, spec: { shape: 'snoot', lossStops: 1, beamAngleDeg: 20 } };
		expect(modifierFromShelf(snoot)).not.toHaveProperty('emitterShape');
	});

	it('take a front width from the shape when the shelf gives none', () => {
		const snoot = { ...SOFTBOX, name: 'Tin snoot', spec: { shape: 'snoot', lossStops: 1, beamAngleDeg: 20 } };
		expect(modifierFromShelf(snoot)?.sizeM).toBe(0.04);
	});

	it('leave out other kinds, retired items and figures that do not pass', () => {
		const flash = { ...SOFTBOX, kind: 'flash' };
		const retired = { ...SOFTBOX, retiredAt: '2026-11-01T00:00:00.000Z' };
		const broken = { ...SOFTBOX, spec: { shape: 'softbox', lossStops: -1, beamAngleDeg: 90 } };
		expect(shelfModifiers([flash, retired, broken, SOFTBOX]).map((m) => m.gearId)).toEqual([SOFTBOX.id]);
	});

	it('are referenced by the plan, so the server copies them into the revision', () => {
		const plan = { elements: { key: { kind: 'flash' as const, modifier: modifierFromShelf(SOFTBOX) } } };
		expect(referencedGearIds({ plan })).toEqual([SOFTBOX.id]);
	});
});
