import { describe, expect, it } from 'vitest';
import { ELEMENT_KINDS } from './model/schema';
import { defaultElement, REFLECTOR_FINISHES } from './model/defaults';
import { EMPTY_KEPT_PLAN, type EditorModel } from './model/types';
import type { ElementKind } from './model/schema';

const at = (kind: ElementKind, id: string, [xM, yM]: [number, number]) => defaultElement(kind, { id, label: id, xM, yM, zIndex: 0 });
import { flagShadows, reflectorFinish, symbolParts, SYMBOLS, lineWeights, LINE_WEIGHT_PX } from './plan-symbols';
import { describeChange } from './announce';

const ctx = { pxM: 1 / 800, dark: false };

describe('the plan symbols', () => {
	it('draw every element kind from the table', () => {
		for (const kind of ELEMENT_KINDS) {
			expect(SYMBOLS[kind], kind).toBeDefined();
			expect(symbolParts(at(kind, `${kind}-1`, [0, 0]), ctx).length, kind).toBeGreaterThan(0);
		}
	});
	it('keep two line weights in a ratio of 2:1, scaled with zoom within limits', () => {
		expect(LINE_WEIGHT_PX.thick / LINE_WEIGHT_PX.thin).toBe(2);
		expect(lineWeights(100).thin).toBeCloseTo(LINE_WEIGHT_PX.thin * 0.75, 9);
		expect(lineWeights(100_000).thick).toBeCloseTo(LINE_WEIGHT_PX.thick * 1.5, 9);
	});
	it('show a card’s surface in its pattern: white plain, silver crossed, gold single hatching, black solid', () => {
		const card = at('reflector', 'card', [0, 0]);
		if (card.kind !== 'reflector') throw new Error('a reflector');
		const finish = (f: 'white' | 'silver' | 'gold' | 'black') => ({ ...card, ...REFLECTOR_FINISHES[f] });
		for (const f of ['white', 'silver', 'gold', 'black'] as const) expect(reflectorFinish(finish(f))).toBe(f);
		// A measured figure that is none of the four is drawn as the nearest look.
		expect(reflectorFinish({ ...card, surface: 'specular', reflectance: 0.6 })).toBe('silver');
		expect(reflectorFinish({ ...card, surface: 'diffuse', reflectance: 0.1 })).toBe('black');
		expect(symbolParts(finish('silver'), ctx)[0].hatch?.anglesDeg).toEqual([45, -45]);
		expect(symbolParts(finish('gold'), ctx)[0].hatch?.anglesDeg).toEqual([45]);
		expect(symbolParts(finish('black'), ctx)[0].fill).toBe('ink');
		expect(symbolParts(finish('white'), ctx)[0].hatch).toBeUndefined();
	});
	it('draw a light in the colour of its kelvin, a continuous light with two rings', () => {
		const warm = symbolParts({ ...at('continuous', 'lamp', [0, 0]), kelvin: 3200 } as never, ctx);
		const rings = warm.filter((p) => 'circle' in p.shape);
		expect(rings.length).toBe(2);
		const fill = rings[0].fill as { colour: string };
		// 3200 K is warm: more red than blue (Planckian locus).
		expect(parseInt(fill.colour.slice(1, 3), 16)).toBeGreaterThan(parseInt(fill.colour.slice(5, 7), 16));
		expect(symbolParts(at('flash', 'f', [0, 0]), ctx).filter((p) => 'circle' in p.shape).length).toBe(1);
	});
	it('draw a kind not in the table by its outline (a new kind is one entry)', () => {
		expect(symbolParts({ ...at('flag', 'x', [0, 0]), kind: 'lectern' } as never, ctx).length).toBe(1);
	});
});

const CAMERA = { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0.5 };
function model(elements: Record<string, unknown>): EditorModel {
	return { elements, camera: CAMERA, ambient: null, kept: EMPTY_KEPT_PLAN } as unknown as EditorModel;
}

describe('flagShadows', () => {
	const subject = { ...at('subject', 'subject', [0, 0]), zIndex: 0 };
	const flash = { ...at('flash', 'key', [-0.4, 0]), zIndex: 1 };
	it('hatches the wedge behind a flag for a light it blocks, and none for a light it does not', () => {
		const flag = { ...at('flag', 'flag', [-0.2, 0]), rotationDeg: 0, widthM: 0.2, zIndex: 2 };
		const shadows = flagShadows(model({ subject, key: flash, flag }));
		expect(shadows.map((s) => s.id)).toEqual(['flag:key']);
		// The wedge runs from the flag to past the subject (x > 0).
		expect(Math.max(shadows[0].points[4], shadows[0].points[6])).toBeGreaterThan(0);
		const aside = { ...flag, yM: 0.5 };
		expect(flagShadows(model({ subject, key: flash, flag: aside }))).toEqual([]);
	});
});

describe('describeChange', () => {
	const fmt = (m: number) => `${Math.round(m * 100)} cm`;
	const flash = { ...at('flash', 'key', [0.3, 0]), label: 'Key flash' };
	it('says what a change did, in words', () => {
		const before = model({ key: flash });
		expect(describeChange(before, model({ key: { ...flash, rotationDeg: 29.6 } }), fmt)).toBe('Key flash turned to 30°.');
		expect(describeChange(before, model({ key: { ...flash, xM: 0.1 } }), fmt)).toBe('Key flash moved to 10 cm, 0 cm.');
		expect(describeChange(before, model({}), fmt)).toBe('Key flash deleted.');
		expect(describeChange(before, before, fmt)).toBeNull();
	});
});
