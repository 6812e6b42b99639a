import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CALCULATIONS, computeSafely, runCalculation, type CalculationPath } from './calculations';

describe('calculations without HTTP', () => {
	it('validates and computes a route body', () => {
		const r = runCalculation('/api/v1/calc/colour', { fromKelvin: 5500, toKelvin: 3200 });
		expect(r.ok && (r.data as { miredShift: number }).miredShift).toBeCloseTo(130.68, 2);
	});

	it('names the field at fault', () => {
		const r = runCalculation('/api/v1/calc/flash', { guideNumber: -3, distance: 1 });
		expect(r).toMatchObject({ ok: false, stage: 'input', issues: [{ path: ['guideNumber'] }] });
	});

	it('an engine that throws or returns a non-finite number is refused, not thrown', () => {
		const throwing = { schema: CALCULATIONS['/api/v1/calc/colour'].schema, compute: () => { throw new Error('boom'); } };
		expect(computeSafely(throwing, {})).toMatchObject({ ok: false, stage: 'compute', message: expect.stringContaining('boom') });
		const infinite = { schema: CALCULATIONS['/api/v1/calc/colour'].schema, compute: () => ({ a: [1, Infinity] }) };
		expect(computeSafely(infinite, {})).toMatchObject({ ok: false, stage: 'compute', issues: [{ message: 'no finite value for a.1' }] });
	});

	it('property: any JSON on any route gives an outcome, never a throw', () => {
		const paths = Object.keys(CALCULATIONS) as CalculationPath[];
		fc.assert(
			fc.property(fc.constantFrom(...paths), fc.jsonValue(), (path, body) => {
				const r = runCalculation(path, body);
				expect(typeof r.ok).toBe('boolean');
			}),
			{ numRuns: 500 }
		);
	});
});
