import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	airyDiskUm,
	balancedAperture,
	bellowsFactor,
	closeUpDepthOfFieldMm,
	diffractionLimitWorkingAperture,
	extensionForMagnification,
	hyperfocalDistanceMm,
	isDiffractionLimited,
	lightLossStops,
	magnificationFromCloseUpLens,
	magnificationFromExtension,
	markedApertureFor,
	opticsCalc,
	subjectDistanceMm,
	workingAperture
} from './optics';

describe('working aperture and bellows factor', () => {
	it('f/16 at 1:1 with a symmetric lens works at f/32', () => {
		// Source: effective f-number N_w = N(1 + m/P) (The Manual of Photography, Jacobson et al., close-up
		// photography chapter; from memory). P = 1 for a symmetric lens.
		expect(workingAperture(16, 1)).toBe(32);
	});

	it('bellows factor at 1:1 is 4 (two stops); at 2:1 it is 9', () => {
		// Source: bellows (exposure) factor (1 + m)² (The Manual of Photography, close-up chapter; from memory).
		expect(bellowsFactor(1)).toBe(4);
		expect(bellowsFactor(2)).toBe(9);
		expect(lightLossStops(1)).toBeCloseTo(2, 12);
		expect(lightLossStops(2)).toBeCloseTo(Math.log2(9), 12);
	});

	it('at 1:2 (m = 0.5) the loss is 2·log2(1.5) ≈ 1.17 stops', () => {
		// Source: (1 + m)² = 2.25 at half life size (as above), log2(2.25) = 1.17.
		expect(lightLossStops(0.5)).toBeCloseTo(1.17, 2);
	});

	it('a retrofocus-type lens with pupil magnification 0.5 at 1:1 works at 3 × N', () => {
		// Source: N_w = N(1 + m/P) with the pupil magnification P = exit/entrance pupil (Ray, Applied
		// Photographic Optics, close-up exposure; from memory).
		expect(workingAperture(8, 1, 0.5)).toBe(24);
		expect(markedApertureFor(24, 1, 0.5)).toBe(8);
	});

	it('at infinity focus (m = 0) there is no loss', () => {
		// Source: (1 + 0)² = 1 (as above).
		expect(workingAperture(5.6, 0)).toBe(5.6);
		expect(lightLossStops(0)).toBe(0);
	});
});

describe('magnification from extension and close-up lenses', () => {
	it('25 mm of extension on a 50 mm lens at infinity gives 0.5×', () => {
		// Source: thin lens, m = extension / f (Hecht, Optics, §5.2.3 thin lenses, Newtonian form x_i = f·m;
		// from memory).
		expect(magnificationFromExtension(25, 50)).toBe(0.5);
		expect(extensionForMagnification(1, 100)).toBe(100);
	});

	it('a +1 dioptre close-up lens on a 50 mm lens at infinity gives 0.05×, subject at 1 m', () => {
		// Source: close-up lens of D dioptres has focal length 1/D m, m = f·D (thin lenses in contact,
		// Hecht, Optics, §5.2; from memory).
		expect(magnificationFromCloseUpLens(1, 50)).toBeCloseTo(0.05, 12);
	});

	it('a +4 dioptre close-up lens on a 100 mm lens gives 0.4×', () => {
		// Source: as above, 100 mm × 4 D / 1000.
		expect(magnificationFromCloseUpLens(4, 100)).toBeCloseTo(0.4, 12);
	});

	it('a close-up lens adds to the magnification the prime lens already has', () => {
		// Source: as above, focused closer the lens's own magnification adds (from memory).
		expect(magnificationFromCloseUpLens(2, 100, 0.25)).toBeCloseTo(0.45, 12);
	});

	it('at 1:1 the subject sits 2f from the lens', () => {
		// Source: thin lens equation 1/u + 1/v = 1/f with v = u at m = 1 (Hecht, Optics, §5.2).
		expect(subjectDistanceMm(1, 100)).toBe(200);
	});
});

describe('depth of field, hyperfocal distance and diffraction', () => {
	it('close-up DoF at 1:1, f/16, c = 0.03 mm is 1.92 mm', () => {
		// Source: close-up depth of field DoF ≈ 2Nc(1 + m)/m² (standard close-up approximation, e.g.
		// Lefkowitz, The Manual of Close-Up Photography; from memory).
		expect(closeUpDepthOfFieldMm(16, 1, 0.03)).toBeCloseTo(1.92, 12);
	});

	it('close-up DoF at 0.5×, f/11, c = 0.03 mm is 3.96 mm', () => {
		// Source: as above, 2 × 11 × 0.03 × 1.5 / 0.25.
		expect(closeUpDepthOfFieldMm(11, 0.5, 0.03)).toBeCloseTo(3.96, 12);
	});

	it('close-up DoF at 2:1, f/8 is a third of a millimetre', () => {
		// Source: as above, 2 × 8 × 0.03 × 3 / 4 = 0.36 mm.
		expect(closeUpDepthOfFieldMm(8, 2, 0.03)).toBeCloseTo(0.36, 12);
	});

	it('hyperfocal distance of a 50 mm lens at f/8, c = 0.03 mm is about 10.5 m', () => {
		// Source: H = f²/(N·c) + f (Ray, Applied Photographic Optics, depth of field; from memory).
		expect(hyperfocalDistanceMm(50, 8, 0.03)).toBeCloseTo(10466.7, 1);
	});

	it('Airy disk at λ = 550 nm, f/8 is 10.7 µm across', () => {
		// Source: Fraunhofer diffraction at a circular aperture, first dark ring at sin θ = 1.22 λ/D, so the
		// disk diameter is 2.44·λ·N (Born & Wolf, Principles of Optics, §8.5.2; Hecht, Optics, §10.2.5).
		expect(airyDiskUm(8, 550)).toBeCloseTo(10.736, 3);
	});

	it('2.44 is twice the first zero of J1 over π', () => {
		// Source: first zero of the Bessel function J1 is 3.8317 (Born & Wolf, §8.5.2), 2 × 3.8317/π = 2.439.
		expect((2 * 3.8317) / Math.PI).toBeCloseTo(2.44, 2);
	});

	it('Airy disk at f/22 working is about 29.5 µm', () => {
		// Source: 2.44 λ N as above.
		expect(airyDiskUm(22)).toBeCloseTo(29.52, 2);
	});

	it('with c = 0.03 mm diffraction sets in past about f/22 working', () => {
		// Source: Airy disk = c when N = c/(2.44 λ) (as above): 30 µm / (2.44 × 0.55 µm) = 22.4.
		expect(diffractionLimitWorkingAperture(0.03, 550)).toBeCloseTo(22.35, 2);
		expect(isDiffractionLimited(22)).toBe(false);
		expect(isDiffractionLimited(32)).toBe(true);
	});
});

describe('balanced aperture (our model) and the optics route', () => {
	it('the balanced aperture makes the edge defocus blur equal to the Airy disk', () => {
		const m = 1;
		const depth = 2;
		const b = balancedAperture(depth, m);
		const defocusUm = ((depth * m * m) / 2 / b.workingAperture) * 1000;
		expect(defocusUm).toBeCloseTo(airyDiskUm(b.workingAperture), 9);
		expect(b.markedAperture).toBeCloseTo(b.workingAperture / 2, 12);
	});

	it('optics route at 1:1, f/16, 18 mm deep subject', () => {
		const r = opticsCalc({ aperture: 16, magnification: 1, pupilMagnification: 1, cocMm: 0.03, wavelengthNm: 550, subjectDepthMm: 18, overlap: 0.2, focalLengthMm: 100 });
		expect(r.workingAperture).toBe(32);
		expect(r.lightLossStops).toBeCloseTo(2, 12);
		expect(r.dofMm).toBeCloseTo(1.92, 12);
		expect(r.airyDiskUm).toBeCloseTo(2.44 * 0.55 * 32, 12);
		expect(r.diffractionLimited).toBe(true);
		expect(r.stack).toEqual({ frames: 12, stepMm: expect.closeTo(1.536, 12) });
		expect(r.extensionMm).toBe(100);
		expect(r.subjectDistanceMm).toBe(200);
	});

	it('property: DoF grows in proportion to the aperture and falls with magnification', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1, max: 64, noNaN: true }),
				fc.double({ min: 0.05, max: 10, noNaN: true }),
				(n, m) => {
					expect(closeUpDepthOfFieldMm(2 * n, m) / closeUpDepthOfFieldMm(n, m)).toBeCloseTo(2, 9);
					expect(closeUpDepthOfFieldMm(n, 2 * m)).toBeLessThan(closeUpDepthOfFieldMm(n, m));
				}
			)
		);
	});

	it('property: never NaN or Infinity for valid input', () => {
		fc.assert(
			fc.property(
				fc.record({
					aperture: fc.double({ min: 0.5, max: 512, noNaN: true }),
					magnification: fc.double({ min: 1e-6, max: 100, noNaN: true }),
					pupilMagnification: fc.double({ min: 0.05, max: 20, noNaN: true }),
					cocMm: fc.double({ min: 0.0005, max: 5, noNaN: true }),
					wavelengthNm: fc.double({ min: 200, max: 2000, noNaN: true }),
					subjectDepthMm: fc.double({ min: 1e-6, max: 100000, noNaN: true }),
					overlap: fc.double({ min: 0, max: 0.95, noNaN: true }),
					focalLengthMm: fc.double({ min: 1, max: 5000, noNaN: true })
				}),
				(input) => {
					const r = opticsCalc(input);
					for (const v of [r.workingAperture, r.lightLossStops, r.dofMm, r.airyDiskUm, r.stack?.frames, r.stack?.stepMm, r.balancedAperture?.markedAperture, r.extensionMm, r.subjectDistanceMm]) {
						expect(Number.isFinite(v)).toBe(true);
					}
				}
			)
		);
	});
});
