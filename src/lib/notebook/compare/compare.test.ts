import { describe, expect, it } from 'vitest';
import { exposureSceneSchema, type ExposureSceneInput } from '$lib/light/schema';
import type { Plan } from '$lib/scene/document';
import { compareDocuments, comparisonSentences, diffLines, type ComparableDocument } from './index';

// The quartz cluster of the demo scenario, reduced to one flash so the expected stops are plain
// inverse-square arithmetic.
function quartz(overrides: Partial<ExposureSceneInput> = {}, extra: Partial<ComparableDocument> = {}): ComparableDocument {
	const scene = exposureSceneSchema.parse({
		camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 },
		subject: { position: [0, 0, 0] },
		lights: [{ id: 'key', kind: 'flash', position: [0.3, 0, 0], guideNumber: 32, power: 0.125 }],
		...overrides
	});
	return { scene, plan: { elements: { key: { kind: 'flash', label: 'Key in softbox' } } }, notes: '', ...extra };
}

const key = (position: [number, number, number], extra: Record<string, unknown> = {}) => ({
	id: 'key',
	kind: 'flash' as const,
	position,
	guideNumber: 32,
	power: 0.125,
	...extra
});

describe('compareDocuments', () => {
	it('finds nothing between a revision and its copy', () => {
		const c = compareDocuments(quartz(), quartz());
		expect(c.identical).toBe(true);
		expect(c.added).toEqual([]);
		expect(c.moved).toEqual([]);
		expect(c.exposure.deltaStops).toBe(0);
		expect(comparisonSentences(c)).toEqual([]);
	});

	it('a flash moved from 30 cm to 40 cm: the move, the new distance and −0.83 stops', () => {
		const c = compareDocuments(quartz(), quartz({ lights: [key([0.4, 0, 0])] }));
		expect(c.identical).toBe(false);
		expect(c.moved).toHaveLength(1);
		expect(c.moved[0].distanceM).toBeCloseTo(0.1, 12);
		expect(c.moved[0].subjectDistanceM).toEqual({ before: 0.3, after: 0.4 });
		expect(c.moved[0].text).toBe('Flash “Key in softbox” moved 10 cm: now 40 cm from the subject (was 30 cm)');
		// Inverse-square law (any photography textbook, e.g. Langford's Basic Photography, light chapter):
		// exposure ∝ 1/d², so 30 → 40 cm is 2·log2(0.3/0.4) = −0.830 stops.
		expect(c.exposure.deltaStops).toBeCloseTo(2 * Math.log2(0.3 / 0.4), 9);
		expect(c.exposure.lights[0].deltaStops).toBeCloseTo(-0.83, 2);
		// The sentence prints each side to 0.1 stop (+2.5 → +1.6) and their difference from those figures
		// (−0.9), so the words add up; the exact −0.83 is in deltaStops above.
		expect(c.exposure.text).toBe('Exposure −0.9 stops: +2.5 stops at f/16 → +1.6 stops at f/16.');
	});

	it('states a move in inches for an imperial user', () => {
		const c = compareDocuments(quartz(), quartz({ lights: [key([0.4, 0, 0])] }), { unitSystem: 'imperial' });
		// 0.1 m / 0.0254 m per inch = 3.94 in (the inch is exactly 25.4 mm: international yard and pound, 1959).
		expect(c.moved[0].text).toBe('Flash “Key in softbox” moved 3.94 in: now 15.7 in from the subject (was 11.8 in)');
	});

	it('a move straight up is a raise, in 3-D distance', () => {
		const c = compareDocuments(quartz(), quartz({ lights: [key([0.3, 0, 0.4])] }));
		expect(c.moved[0].heightChangeM).toBeCloseTo(0.4, 12);
		// √(0.3² + 0.4²) = 0.5 m (the 3-4-5 triangle).
		expect(c.moved[0].subjectDistanceM?.after).toBeCloseTo(0.5, 12);
		expect(c.moved[0].text).toContain('moved 40 cm (raised 40 cm): now 50 cm from the subject');
	});

	it('ignores a move below a millimetre (drag rounding)', () => {
		const c = compareDocuments(quartz(), quartz({ lights: [key([0.3004, 0, 0])] }));
		expect(c.moved).toEqual([]);
	});

	it('a power change from 1/8 to 1/4 is one stop more', () => {
		const c = compareDocuments(quartz(), quartz({ lights: [key([0.3, 0, 0], { power: 0.25 })] }));
		expect(c.altered.map((a) => a.text)).toEqual(['Flash “Key in softbox”: power 1/8 → 1/4 (+1 stop)']);
		// Doubling the flash's energy doubles the exposure: one stop (definition of the stop).
		expect(c.exposure.deltaStops).toBeCloseTo(1, 9);
	});

	it('names added and removed elements, with a new light’s distance to the subject', () => {
		const before = quartz({
			lights: [key([0.3, 0, 0]), { id: 'card', kind: 'reflector', position: [-0.2, 0, 0], areaM2: 0.06, reflectance: 0.9, surface: 'diffuse', source: 'key' }]
		});
		const after = quartz({
			lights: [key([0.3, 0, 0]), { id: 'fill', kind: 'flash', position: [0, 0.5, 0], guideNumber: 20, power: 0.0625 }],
			flags: [{ id: 'gobo', from: [0.1, 0.2], to: [0.1, 0.4] }]
		});
		const c = compareDocuments(before, after);
		expect(c.added.map((e) => e.text).sort()).toEqual(['Flag “gobo” added', 'Flash “fill” added 50 cm from the subject']);
		expect(c.removed.map((e) => e.text)).toEqual(['Reflector “card” removed']);
	});

	it('settings: aperture one stop down and ISO doubled cancel out', () => {
		const after = quartz({ camera: { iso: 200, aperture: 16 * Math.SQRT2, shutter: 1 / 125, magnification: 0 } });
		const c = compareDocuments(quartz(), after);
		expect(c.settings.map((s) => s.setting)).toEqual(['iso', 'aperture']);
		expect(c.settings[0].text).toBe('ISO 100 → 200 (+1 stop)');
		// f/16 → f/22.6 halves the light: N² doubles (the f-number series, definition).
		expect(c.settings[1].text).toBe('Aperture f/16 → f/22.6 (−1 stop of light)');
		// Flash exposure ∝ ISO / N²: ×2 / ×2 = no change.
		expect(c.exposure.deltaStops).toBeCloseTo(0, 9);
		// GN 32 at 1/8 power is 32·√(1/8) = 11.3; at 30 cm that wants f/37.7, so f/16 is 2·log2(37.7/16) = +2.5
		// stops over (guide-number formula GN = d × N, ISO 1230; from memory), before and after.
		expect(c.exposure.afterStops).toBeCloseTo(2 * Math.log2((32 * Math.sqrt(0.125)) / 0.3 / 16), 9);
		expect(c.exposure.text).toBe('Exposure unchanged: +2.5 stops at f/22.6.');
	});

	it('magnification 0 → 1 costs two stops at the working aperture', () => {
		const after = quartz({ camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 1 } });
		const c = compareDocuments(quartz(), after);
		expect(c.settings[0].text).toBe('Magnification 0× → 1×');
		// Bellows factor (1 + m)² = 4 at 1:1: two stops (The Manual of Photography, close-up chapter; from memory).
		expect(c.exposure.deltaStops).toBeCloseTo(-2, 9);
	});

	it('ambient added and its EV changed', () => {
		const a = quartz({ ambient: { ev100: 9 } });
		const b = quartz({ ambient: { ev100: 10, kelvin: 6500 } });
		const c = compareDocuments(a, b);
		expect(c.settings.map((s) => s.text)).toEqual(['Ambient EV 9 → 10 (+1 stop)', 'Ambient colour temperature not set → 6500 K']);
		const d = compareDocuments(quartz(), a);
		expect(d.settings.map((s) => s.text)).toEqual(['Ambient light added: EV 9 at ISO 100']);
	});

	it('a flag placed across the key light’s path: the light no longer reaches the subject', () => {
		const after = quartz({ flags: [{ id: 'gobo', from: [0.15, -0.1], to: [0.15, 0.1] }] });
		const c = compareDocuments(quartz(), after);
		expect(c.exposure.afterStops).toBeNull();
		expect(c.exposure.text).toMatch(/now no light reaches the subject/);
		expect(c.exposure.lights[0].text).toBe('Flash “Key in softbox”: no longer reaches the subject (blocked by a flag)');
	});

	it('plan-only elements: a background turned and resized, a label renamed', () => {
		const plan = (rotationDeg: number, widthM: number, label: string): Plan => ({
			elements: { key: { kind: 'flash', label: 'Key in softbox' }, bg: { kind: 'background', label, position: [0, -0.5, 0], rotationDeg, widthM } }
		});
		const c = compareDocuments(quartz({}, { plan: plan(0, 0.5, 'Black velvet') }), quartz({}, { plan: plan(-30, 0.7, 'Grey card') }));
		expect(c.moved.map((m) => m.text)).toEqual(['Background “Grey card” turned 30° clockwise']);
		expect(c.altered.map((a) => a.text).sort()).toEqual([
			'Background “Black velvet” renamed “Grey card”',
			'Background “Grey card” resized 50 cm → 70 cm'
		]);
	});

	it('a reflector made silver and larger', () => {
		const card = { id: 'card', kind: 'reflector' as const, position: [-0.2, 0, 0] as [number, number, number], areaM2: 0.06, reflectance: 0.9, surface: 'diffuse' as const, source: 'key' };
		const a = quartz({ lights: [key([0.3, 0, 0]), card] });
		const b = quartz({ lights: [key([0.3, 0, 0]), { ...card, areaM2: 0.12, reflectance: 0.95, surface: 'specular' }] });
		const c = compareDocuments(a, b);
		// The card's size (its area) comes after the light's own figures: one entry with the drawn size, when the plan gives one.
		expect(c.altered.map((x) => x.text)).toEqual([
			'Reflector “card”: reflectance 90 % → 95 %',
			'Reflector “card”: surface diffuse → specular',
			'Reflector “card”: area 600 cm² → 1200 cm²'
		]);
	});

	it('notes: lines added and removed', () => {
		const c = compareDocuments(quartz({}, { notes: 'Velvet under the base.\nCard at 20 cm.' }), quartz({}, { notes: 'Velvet under the base.\nCard at 15 cm.\nShoot at f/16.' }));
		expect(c.notes.changed).toBe(true);
		expect(c.notes.text).toBe('Notes changed (2 lines added, 1 line removed)');
		expect(comparisonSentences(c)).toContain('Notes changed (2 lines added, 1 line removed)');
		expect(compareDocuments(quartz(), quartz({}, { notes: 'First note' })).notes.text).toBe('Notes written');
	});
});

describe('diffLines', () => {
	it('keeps the common lines and marks the rest', () => {
		expect(diffLines('a\nb\nc', 'a\nx\nc')).toEqual([
			{ op: 'same', line: 'a' },
			{ op: 'added', line: 'x' },
			{ op: 'removed', line: 'b' },
			{ op: 'same', line: 'c' }
		]);
	});

	it('an empty text against a text is all additions', () => {
		expect(diffLines('', 'one\ntwo')).toEqual([
			{ op: 'added', line: 'one' },
			{ op: 'added', line: 'two' }
		]);
	});

	it('the same text gives only same lines', () => {
		const ops = diffLines('p\nq', 'p\nq');
		expect(ops.every((o) => o.op === 'same')).toBe(true);
	});

	it('a text changed beyond the edit limit reads as replaced, every line kept', () => {
		const before = Array.from({ length: 2500 }, (_, i) => `old ${i}`).join('\n');
		const after = Array.from({ length: 2500 }, (_, i) => `new ${i}`).join('\n');
		const ops = diffLines(before, after);
		expect(ops.filter((o) => o.op === 'added')).toHaveLength(2500);
		expect(ops.filter((o) => o.op === 'removed')).toHaveLength(2500);
		expect(ops[0]).toEqual({ op: 'added', line: 'new 0' });
	});
});
