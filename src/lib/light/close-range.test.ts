/**
 * The engine at close range: how the magnification is made, which face of the subject a light reaches,
 * lights with a size, mirror geometry, the subject's depth, and the flash the shelf really holds. Each
 * expected value names its source beside it.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { centredRectangleConfigurationFactor, cornerRectangleConfigurationFactor, sizedSourceFactor } from './extended-source';
import { flashCalc } from './flash';
import { ambientCalc } from './ambient';
import { opticsCalc } from './optics';
import { computeExposure } from './scene';
import { exposureSceneSchema, flashCalcSchema, opticsCalcSchema, ambientCalcSchema, type ExposureSceneInput } from './schema';

const run = (input: ExposureSceneInput) => computeExposure(exposureSceneSchema.parse(input));
type V3 = [number, number, number];
const camera = { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 };

describe('1. how the magnification is made', () => {
	it('a +4 D close-up lens on a 100 mm lens at infinity gives m = 0.4 and costs no light', () => {
		// Source: a close-up lens leaves the prime focused at infinity, so its working aperture is the marked
		// one (m = f·D = 0.1 m × 4 D = 0.4; from memory, the usual close-up lens treatment). The extension
		// rule would charge 2·log2(1.4) = 0.97 stop.
		const closeUp = opticsCalc(opticsCalcSchema.parse({ aperture: 16, magnification: 0.4, magnificationBy: 'close-up-lens' }));
		expect(closeUp.workingAperture).toBe(16);
		expect(closeUp.lightLossStops).toBe(0);
		const flash = flashCalc(flashCalcSchema.parse({ guideNumber: 32, distance: 0.5, aperture: 16, magnification: 0.4, magnificationBy: 'close-up-lens' }));
		expect(flash.workingAperture).toBe(16);
		const scene = run({ camera: { ...camera, magnification: 0.4, magnificationBy: 'close-up-lens' }, subject: { position: [0, 0, 0] }, lights: [] });
		expect(scene.workingAperture).toBe(16);
	});

	it('extension stays the default: N × (1 + m/P)', () => {
		// Source: effective f-number N(1 + m/P) (The Manual of Photography, close-up chapter; from memory).
		expect(opticsCalc(opticsCalcSchema.parse({ aperture: 16, magnification: 1, pupilMagnification: 0.5 })).workingAperture).toBe(48);
	});

	it('a reversed lens swaps its pupils: N × (1/P + m)', () => {
		// Source: reversed, the entrance pupil is the old exit pupil (N → N/P) and P → 1/P (from memory).
		// A lens with P = 0.5 at 1:1: forward f/16 works at 16 × 3 = f/48, reversed at 16 × (2 + 1) = f/48
		// too at 1:1, but at 2:1 forward gives f/80 and reversed 16 × 4 = f/64.
		const at = (magnificationBy: 'extension' | 'reversed-lens') =>
			opticsCalc(opticsCalcSchema.parse({ aperture: 16, magnification: 2, pupilMagnification: 0.5, magnificationBy })).workingAperture;
		expect(at('extension')).toBe(80);
		expect(at('reversed-lens')).toBe(64);
	});

	it('a 2× teleconverter doubles the f-number; a camera that shows the working aperture is not corrected again', () => {
		// Source: a teleconverter of factor k multiplies the f-number by k (common practice); with 1:1 from a
		// 2× converter the lens itself works at 1:2: 2 × 16 × (1 + 0.5) = f/48.
		expect(opticsCalc(opticsCalcSchema.parse({ aperture: 16, magnification: 1, teleconverterFactor: 2 })).workingAperture).toBe(48);
		expect(opticsCalc(opticsCalcSchema.parse({ aperture: 32, magnification: 1, magnificationBy: 'camera-shows-working' })).workingAperture).toBe(32);
	});

	it('property: a dioptre never changes the exposure', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 3, noNaN: true }), fc.double({ min: 0.2, max: 2, noNaN: true }), (m, p) => {
				const r = run({
					camera: { ...camera, magnification: m, pupilMagnification: p, magnificationBy: 'close-up-lens' },
					subject: { position: [0, 0, 0] },
					lights: [{ id: 'k', kind: 'flash', position: [0.3, 0, 0.2], guideNumber: 20, power: 0.25 }]
				});
				const bare = run({ camera, subject: { position: [0, 0, 0] }, lights: [{ id: 'k', kind: 'flash', position: [0.3, 0, 0.2], guideNumber: 20, power: 0.25 }] });
				expect(r.total.x).toBeCloseTo(bare.total.x, 10);
			})
		);
	});
});

describe('2. depth of field far from 1:1', () => {
	it('f/22, m = 0.02, 50 mm: the thin-lens total is about 5.96 m, the close-up figure 43 % short', () => {
		// Source: Wikipedia, "Depth of field", the thin-lens formulae with the hyperfocal distance
		// H = f²/(Nc) + f: near s(H − f)/(H + s − 2f), far s(H − f)/(H − s); s = f(1 + 1/m) = 2550 mm,
		// H = 3837.9 mm → near 1536 mm, far 7500 mm.
		const r = opticsCalc(opticsCalcSchema.parse({ aperture: 22, magnification: 0.02, focalLengthMm: 50 }));
		expect(r.depthOfField.formula).toBe('thin-lens');
		expect(r.depthOfField.nearMm).toBeCloseTo(1536.2, 0);
		expect(r.depthOfField.farMm).toBeCloseTo(7500, -1);
		expect(r.depthOfField.totalMm!).toBeCloseTo(5964, -1);
		expect(1 - r.dofMm / r.depthOfField.totalMm!).toBeCloseTo(0.436, 2);
		// Far from 1:1 the zone behind is longer than the one in front.
		expect(r.depthOfField.behindMm!).toBeGreaterThan(3 * r.depthOfField.inFrontMm);
	});

	it('at 1:1 the thin-lens and close-up figures agree within 1 %; without a focal length the close-up one answers', () => {
		// Source: as above; at m = 1 both give about 4·N·c (Wikipedia, "Depth of field", close-up).
		const r = opticsCalc(opticsCalcSchema.parse({ aperture: 11, magnification: 1, focalLengthMm: 100 }));
		expect(r.depthOfField.totalMm! / r.dofMm).toBeCloseTo(1, 2);
		expect(opticsCalc(opticsCalcSchema.parse({ aperture: 11, magnification: 1 })).depthOfField).toMatchObject({ formula: 'close-up', totalMm: r.dofMm });
		// Beyond the hyperfocal distance the far limit is infinity.
		const far = opticsCalc(opticsCalcSchema.parse({ aperture: 22, magnification: 0.005, focalLengthMm: 50 }));
		expect(far.depthOfField.farMm).toBeNull();
		expect(far.depthOfField.totalMm).toBeNull();
	});
});

describe('3. one working aperture for every question', () => {
	it('the ambient question uses the pupil magnification like the flash question', () => {
		// Source: N(1 + m/P) (as above): f/16 at 1:1 with P = 0.6 works at 16 × 2.667 = f/42.7.
		const flash = flashCalc(flashCalcSchema.parse({ guideNumber: 32, distance: 0.3, aperture: 16, magnification: 1, pupilMagnification: 0.6 }));
		const ambient = ambientCalc(ambientCalcSchema.parse({ ev100: 12, aperture: 16, magnification: 1, pupilMagnification: 0.6 }));
		expect(ambient.workingAperture).toBeCloseTo(flash.workingAperture!, 12);
		expect(flash.workingAperture).toBeCloseTo(42.667, 3);
	});
});

describe('5. the angle of incidence on the subject', () => {
	const rakeAt = (deg: number, facing?: 'up'): ExposureSceneInput => ({
		camera: { ...camera, position: [0, 0, 0.5] },
		subject: { position: [0, 0, 0], ...(facing ? { facing } : {}) },
		lights: [{ id: 'rake', kind: 'flash', position: [0.5 * Math.cos((deg * Math.PI) / 180), 0, 0.5 * Math.sin((deg * Math.PI) / 180)], guideNumber: 8, power: 1 }]
	});

	it('a rake at 4° to a face-up section gives log2(sin 4°) ≈ −3.8 stops against the same light square on', () => {
		// Source: Lambert's cosine law, E = E⊥ · cos θ (Hecht, "Optics", irradiance; from memory): the light
		// meets the face at 86° from its normal, cos 86° = 0.0698, log2 = −3.84.
		const raked = run(rakeAt(4, 'up'));
		const square = run({ ...rakeAt(4, 'up'), subject: { position: [0, 0, 0], normal: [Math.cos((4 * Math.PI) / 180), 0, Math.sin((4 * Math.PI) / 180)] } });
		expect(raked.lights[0].stops! - square.lights[0].stops!).toBeCloseTo(Math.log2(Math.sin((4 * Math.PI) / 180)), 10);
		expect(raked.lights[0].stops! - square.lights[0].stops!).toBeLessThan(-3.7);
	});

	it('with a camera position the subject faces the camera by default', () => {
		// Source: Lambert's cosine law (as above): a light 60° off the camera axis gives cos 60° = half.
		const r = run({
			camera: { ...camera, position: [0, -1, 0] },
			subject: { position: [0, 0, 0] },
			lights: [{ id: 'k', kind: 'flash', position: [Math.sin(Math.PI / 3), -Math.cos(Math.PI / 3), 0], guideNumber: 16, power: 1 }]
		});
		expect(r.lights[0].x).toBeCloseTo(0.5, 10);
	});

	it('without a camera position, a facing or a normal the API’s original rule holds', () => {
		// Source: API.md, direct flash X = (GN / (d · N_w))²: GN 32 at 2 m and f/16 is 1.
		const r = run({ camera, subject: { position: [0, 0, 0] }, lights: [{ id: 'k', kind: 'flash', position: [2, 0, 0], guideNumber: 32, power: 1 }] });
		expect(r.lights[0].x).toBeCloseTo(1, 12);
	});
});

describe('7. the flash the shelf really holds', () => {
	it('a calibration of −0.7 stop costs 0.7 stop, in the flash question and in the scene', () => {
		// Source: guide number ∝ √(light), so −0.7 stop divides GN by 2^0.35 (common practice).
		const r = flashCalc(flashCalcSchema.parse({ guideNumber: 32, distance: 1, aperture: 16, calibrationOffsetStops: -0.7 }));
		expect(r.effectiveGuideNumber).toBeCloseTo(32 * 2 ** -0.35, 10);
		expect(r.exposureOffsetStops).toBeCloseTo(2 - 0.7, 10);
		const s = run({ camera, subject: { position: [0, 0, 0] }, lights: [{ id: 'k', kind: 'flash', position: [2, 0, 0], guideNumber: 32, power: 1, calibrationOffsetStops: -0.7 }] });
		expect(s.lights[0].stops).toBeCloseTo(-0.7, 10);
	});

	it('a flash that stops at 1/128 is never told to use 1/256', () => {
		// Source: the API's third-stop ladder (API.md), ended at the flash's own lowest step.
		const r = flashCalc(flashCalcSchema.parse({ guideNumber: 64, distance: 1, aperture: 2, lowestPower: 1 / 128 }));
		expect(r.requiredPower).toBeLessThan(1 / 256);
		expect(r.nearestPowerStep).toMatchObject({ label: '1/128' });
		expect(r.withinRange).toBe(false);
		expect(r.lowestPowerStep).toEqual({ fraction: 2 ** -7, label: '1/128' });
		const s = run({ camera, subject: { position: [0, 0, 0] }, lights: [{ id: 'k', kind: 'flash', position: [2, 0, 0], guideNumber: 32, power: 1 / 256, lowestPower: 1 / 128 }] });
		expect(s.warnings.some((w) => w.includes('below its lowest step (1/128)'))).toBe(true);
	});

	it('a suggested marked aperture outside the lens is flagged', () => {
		// GN 32 at 0.5 m wants f/64 working; a lens that stops at f/32 cannot give it (common practice).
		const r = flashCalc(flashCalcSchema.parse({ guideNumber: 32, distance: 0.5, widestAperture: 2.8, narrowestAperture: 32 }));
		expect(r.markedApertureOutsideLens).toBe('narrower');
	});
});

describe('4. exposure per face', () => {
	const quartz = (cardReflectance: number): ExposureSceneInput => ({
		camera: { ...camera, position: [0, -1, 0] },
		subject: { position: [0, 0, 0] },
		lights: [
			{ id: 'key', kind: 'flash', position: [-0.5, 0, 0], guideNumber: 8, power: 1 },
			{ id: 'card', kind: 'reflector', position: [0.2, 0, 0], areaM2: 0.06, reflectance: cardReflectance, surface: 'diffuse', source: 'key', normal: [-1, 0, 0] }
		]
	});

	/** Each light's X on a surface turned square to it: the same scene without a camera position. */
	const squareOn = (input: ExposureSceneInput) => run({ ...input, camera }).lights.map((l) => l.x);

	it('a card opposite the key fills the shadow face and adds nothing to the lit face', () => {
		// Source: Lambert's cosine law (as above): the faces are 45° to the camera axis, so the key gives the
		// lit face cos 45° of its light and the shadow face none; the card gives the shadow face cos 45°.
		const r = run(quartz(0.85));
		const [key, card] = squareOn(quartz(0.85));
		expect(key).toBeCloseTo(1, 12); // GN 8 at 0.5 m and f/16
		expect(r.faces!.lit.x).toBeCloseTo(key * Math.SQRT1_2, 10);
		expect(r.faces!.shadow.x).toBeCloseTo(card * Math.SQRT1_2, 10);
		expect(r.faces!.ratio).toBeCloseTo(key / card, 10);
		expect(r.faces!.ratioConvention).toBe('key : fill');
	});

	it('a fill at the camera reaches both faces: the ratio is key + fill : fill', () => {
		const scene: ExposureSceneInput = {
			camera: { ...camera, position: [0, -1, 0] },
			subject: { position: [0, 0, 0] },
			lights: [
				{ id: 'key', kind: 'flash', position: [-0.5, 0, 0], guideNumber: 8, power: 1 },
				{ id: 'fill', kind: 'flash', position: [0, -0.5, 0], guideNumber: 4, power: 1 }
			]
		};
		const r = run(scene);
		const [k, f] = squareOn(scene);
		expect(r.faces!.ratio).toBeCloseTo((k + f) / f, 10);
		expect(r.faces!.ratioConvention).toBe('key+fill : fill');
	});

	it('property: per-face exposures never exceed the sum of all lights', () => {
		const at = fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: 0.05, max: 1, noNaN: true }));
		const high = fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: 0.2, max: 1, noNaN: true }));
		fc.assert(
			fc.property(high, at, at, fc.boolean(), (k, f, c, withCamera) => {
				const scene: ExposureSceneInput = {
					camera,
					subject: { position: [0, 0, 0] },
					ambient: { ev100: 8 },
					lights: [
						{ id: 'key', kind: 'flash', position: k as V3, guideNumber: 10, power: 1 },
						{ id: 'fill', kind: 'continuous', position: f as V3, luxAt1m: 500 },
						{ id: 'card', kind: 'reflector', position: [-k[0], -k[1], 0.1], areaM2: 0.04, reflectance: 0.8, surface: 'diffuse', source: 'key' }
					]
				};
				const r = run({ ...scene, camera: { ...camera, ...(withCamera ? { position: c as V3 } : {}) } });
				// The sum of all lights, each as a surface turned square to it would get it (no cosine).
				const facing = run(scene).total.x;
				expect(r.total.x).toBeLessThanOrEqual(facing * (1 + 1e-12));
				if (r.faces) {
					expect(r.faces.lit.x).toBeLessThanOrEqual(facing * (1 + 1e-12));
					expect(r.faces.shadow.x).toBeLessThanOrEqual(facing * (1 + 1e-12));
				}
			})
		);
	});
});

describe('6. a mirror-like reflector', () => {
	const silver = (normal: V3): ExposureSceneInput => ({
		camera,
		subject: { position: [0, 0, 0] },
		lights: [
			{ id: 'key', kind: 'flash', position: [-0.4, 0, 0.3], guideNumber: 8, power: 1 },
			{ id: 'silver', kind: 'reflector', position: [0.3, 0, 0], areaM2: 0.01, reflectance: 0.9, surface: 'specular', source: 'key', normal }
		]
	});

	it('returns light where the reflection of its source lands on the subject, at the reflected path', () => {
		// Source: the law of reflection (angle in = angle out; Hecht, "Optics", reflection; from memory): a
		// mirror at x = 0.3 m whose normal bisects the directions to the flash and to the subject sends the
		// flash's image, 0.9 × the flash's X at the image's distance, onto the subject.
		const toFlash: V3 = [-0.7, 0, 0.3];
		const toSubject: V3 = [-0.3, 0, 0];
		const u = (v: V3) => v.map((c) => c / Math.hypot(...v)) as V3;
		const n = u(u(toFlash).map((c, i) => c + u(toSubject)[i]) as V3);
		const r = run(silver(n));
		const path = Math.hypot(...toFlash) + 0.3;
		expect(r.lights[1].x).toBeCloseTo(0.9 * (8 / (path * 16)) ** 2, 10);
	});

	it('returns nothing where the reflection misses the subject, and says so', () => {
		// Facing straight back along −x, the flash's reflection (its image 0.7 m behind the card, 0.3 m up)
		// crosses the card's plane 0.3 m × 0.3 = 9 cm up, beyond a 100 cm² card (radius 5.6 cm) by 3.4 cm.
		const r = run(silver([-1, 0, 0]));
		expect(r.lights[1].x).toBe(0);
		expect(r.lights[1].reflectionMissesBy).toBeCloseTo(0.09 - Math.sqrt(0.01 / Math.PI), 10);
		expect(r.warnings.some((w) => w.includes('“silver”') && w.includes('misses the subject'))).toBe(true);
	});
});

describe('8. lights with a size', () => {
	it('a 30 × 30 cm softbox from 50 cm to 20 cm gains about 2.0 stops, not the point law’s 2.64', () => {
		// Source: configuration factor from a differential element to a parallel rectangle (Howell, "A Catalog
		// of Radiation Heat Transfer Configuration Factors"; the corner case at A = B = 1 is 0.1385, from
		// memory), four corner rectangles for a centred one; point law 2·log2(50/20) = 2.64 stops.
		expect(cornerRectangleConfigurationFactor(1, 1, 1)).toBeCloseTo(0.1385, 4);
		const softbox = (d: number) =>
			run({ camera, subject: { position: [0, 0, 0] }, lights: [{ id: 'box', kind: 'flash', position: [d, 0, 0], guideNumber: 8, power: 1, emitterWidthM: 0.3, emitterHeightM: 0.3 }] });
		const near = softbox(0.2);
		expect(near.lights[0].stops! - softbox(0.5).lights[0].stops!).toBeCloseTo(2.01, 2);
		expect(near.lights[0].sourceModel).toBe('rectangle');
		expect(softbox(1.6).lights[0].sourceModel).toBe('point');
	});

	it('a disc gives d² / (r² + d²) of the point law', () => {
		// Source: configuration factor to a coaxial parallel disc, r² / (r² + d²) (Howell's catalogue; from memory).
		expect(sizedSourceFactor({ shape: 'disc', diameterM: 0.2 }, 0.1)).toBeCloseTo(0.5, 12);
		expect(centredRectangleConfigurationFactor(100, 100, 0.01)).toBeCloseTo(1, 3); // an infinite plane sees everything
	});

	it('property: a sized source converges to the point law beyond five times its size', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.01, max: 2, noNaN: true }), fc.double({ min: 0.01, max: 2, noNaN: true }), fc.double({ min: 5, max: 1000, noNaN: true }), (w, h, k) => {
				const d = k * Math.max(w, h);
				expect(sizedSourceFactor({ shape: 'rectangle', widthM: w, heightM: h }, d)).toBe(1);
				// Just inside five sizes the extended model is already within 1.5 % of the point law.
				expect(sizedSourceFactor({ shape: 'rectangle', widthM: w, heightM: h }, d * 0.9999)).toBeGreaterThan(0.985);
				expect(sizedSourceFactor({ shape: 'disc', diameterM: w }, 5 * w * 0.9999)).toBeGreaterThan(0.985);
			})
		);
	});

	it('property: moving any light farther never increases its exposure', () => {
		const kinds = fc.constantFrom('point', 'disc', 'rectangle');
		fc.assert(
			fc.property(kinds, fc.double({ min: 0.01, max: 1, noNaN: true }), fc.double({ min: 0.01, max: 3, noNaN: true }), fc.double({ min: 1, max: 3, noNaN: true }), (kind, size, d, farther) => {
				const at = (dist: number) =>
					run({
						camera,
						subject: { position: [0, 0, 0] },
						lights: [
							{
								id: 'l',
								kind: 'continuous',
								position: [dist * 0.6, dist * 0.8, 0],
								luxAt1m: 1000,
								...(kind === 'disc' ? { emitterDiameterM: size } : kind === 'rectangle' ? { emitterWidthM: size, emitterHeightM: size / 2 } : {})
							}
						]
					}).lights[0].x;
				expect(at(d * farther)).toBeLessThanOrEqual(at(d) * (1 + 1e-12));
			})
		);
	});
});

describe('9. the subject has depth', () => {
	it('an 18 mm deep specimen 10 cm from the flash loses about half a stop front to back', () => {
		// Source: the inverse-square law: front 9.1 cm, back 10.9 cm along the flash's line, 2·log2(10.9/9.1) = 0.52.
		const r = run({ camera, subject: { position: [0, 0, 0], depthMm: 18 }, lights: [{ id: 'k', kind: 'flash', position: [0.1, 0, 0], guideNumber: 8, power: 1 }] });
		expect(r.lights[0].depthFalloffStops).toBeCloseTo(2 * Math.log2(0.109 / 0.091), 10);
	});
});

describe('10. the circle of confusion from the camera', () => {
	it('a 36 × 24 mm sensor gives d/1500 = 0.0288 mm; a 4 µm pixel pitch gives 0.008 mm for stacking', () => {
		// Source: Wikipedia, "Circle of confusion", the d/1500 convention (43.27 mm / 1500); the pixel-level
		// circle of two pixel pitches is common practice (the Nyquist limit).
		const sensor = opticsCalc(opticsCalcSchema.parse({ aperture: 8, magnification: 1, sensorWidthMm: 36, sensorHeightMm: 24, subjectDepthMm: 10 }));
		expect(sensor.cocMm).toBeCloseTo(0.02884, 5);
		expect(sensor.cocFrom).toBe('sensor-diagonal');
		const pixel = opticsCalc(opticsCalcSchema.parse({ aperture: 8, magnification: 1, pixelPitchUm: 4, cocBasis: 'pixel', subjectDepthMm: 10 }));
		expect(pixel.cocMm).toBeCloseTo(0.008, 12);
		// The stack step follows it: a smaller circle, more frames.
		expect(pixel.stack!.frames).toBeGreaterThan(sensor.stack!.frames);
		expect(pixel.diffractionNote).toMatch(/^diffraction softens detail from f\/\d/);
	});
});

describe('9. the subject has depth, in the flash question', () => {
	it('an 18 mm deep specimen 10 cm from the flash: about half a stop front to back', () => {
		// Source: the inverse-square law: front 9.1 cm, back 10.9 cm, 2·log2(10.9/9.1) = 0.52 stop.
		const r = flashCalc(flashCalcSchema.parse({ guideNumber: 20, distance: 0.1, subjectDepthMm: 18 }));
		expect(r.depthFalloffStops).toBeCloseTo(2 * Math.log2(0.109 / 0.091), 12);
		expect(r.depthFalloffStops).toBeCloseTo(0.52, 2);
	});
});
