/**
 * Exercise targets: the measurable part of a brief ("key to fill about 3:1, f/16, at most two
 * lights"), each a range, evaluated on a scene by the engine's own numbers. Pure functions; the zod
 * schema of the targets lives in $lib/scene/targets.ts. The server evaluates a hand-in from the stored
 * document; the editor evaluates the same targets live on what is on the canvas.
 */
import { angleBetweenDeg, subtract3, type Vec3 } from './geometry';
import { powerLadder, lowestLadderStep, LOWEST_POWER } from './flash';
import { depthOfFieldFromWorkingMm } from './optics';
import { computeExposure, type ExposureResult } from './scene';
import type { ExposureScene, FlashLight } from './schema';

export const TARGET_KINDS = ['exposureOffset', 'lightingRatio', 'aperture', 'depthOfField', 'lightCount', 'keyLightAngle', 'flashPower'] as const;
export type TargetKind = (typeof TARGET_KINDS)[number];

/** One target: a kind and its range (either bound may be open). Depth of field and flash power carry their range in the scene. */
export interface Target {
	kind: TargetKind;
	min?: number;
	max?: number;
}

export interface TargetResult {
	kind: TargetKind;
	/** What is asked, in words ("Lighting ratio 2.5:1 to 4:1"). */
	asked: string;
	/** The value on this scene, in the target's unit; null when it cannot be told. */
	value: number | null;
	/** Null when the target cannot be evaluated on this scene (the reason is in `text`). */
	met: boolean | null;
	/** How far outside the range, in the target's unit (0 when met); null when unknown. */
	missedBy: number | null;
	unit: string;
	/** The value and the verdict in words. */
	text: string;
}

/** The words and units of each kind, for forms, tables and CSV. */
export const TARGET_LABELS: Record<TargetKind, { name: string; unit: string; ranged: boolean }> = {
	exposureOffset: { name: 'Exposure offset at the marked aperture', unit: 'stops', ranged: true },
	lightingRatio: { name: 'Lighting ratio (key to the next light)', unit: ':1', ranged: true },
	aperture: { name: 'Marked aperture', unit: 'f-number', ranged: true },
	depthOfField: { name: "Depth of field at least the subject's depth", unit: 'mm', ranged: false },
	lightCount: { name: 'Number of lights (flashes and continuous)', unit: 'lights', ranged: true },
	keyLightAngle: { name: "Key light's angle from the camera axis", unit: '°', ranged: true },
	flashPower: { name: "Flash power needed within the flash's range", unit: 'stops', ranged: false }
};

// Ranges are compared with a little slack so that a value shown as "3:1" is not refused for 2.9999999.
const SLACK = 1e-6;

const round = (v: number, digits = 2) => Number(v.toFixed(digits));

function show(kind: TargetKind, v: number): string {
	switch (kind) {
		case 'exposureOffset':
			return `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(round(v, 2))} stops`;
		case 'lightingRatio':
			return `${round(v, 2)}:1`;
		case 'aperture':
			return `f/${round(v, 1)}`;
		case 'keyLightAngle':
			return `${round(v, 0)}°`;
		case 'lightCount':
			return `${v} ${v === 1 ? 'light' : 'lights'}`;
		default:
			return `${round(v, 2)} ${TARGET_LABELS[kind].unit}`;
	}
}

/** How far outside a range, in the target's unit: "1.67 stops", "0.45", "15°", "1 light". */
function distance(kind: TargetKind, v: number): string {
	if (kind === 'exposureOffset') return `${round(v, 2)} stops`;
	if (kind === 'keyLightAngle') return `${round(v, 0)}°`;
	if (kind === 'lightCount') return `${v} ${v === 1 ? 'light' : 'lights'}`;
	return `${round(v, 2)}`;
}

/** "f/11 to f/22", "at most 2 lights", "at least 2.5:1". */
export function askedText(target: Target): string {
	const { name, ranged } = TARGET_LABELS[target.kind];
	if (!ranged) return name;
	const { min, max } = target;
	const range =
		min !== undefined && max !== undefined
			? min === max
				? show(target.kind, min)
				: `${show(target.kind, min)} to ${show(target.kind, max)}`
			: min !== undefined
				? `at least ${show(target.kind, min)}`
				: max !== undefined
					? `at most ${show(target.kind, max)}`
					: 'any';
	return `${name}: ${range}`;
}

/** How far `value` lies outside [min, max]: 0 inside, else the distance to the nearer bound. */
export function outsideBy(value: number, min?: number, max?: number): number {
	const tol = SLACK * Math.max(1, Math.abs(value));
	if (min !== undefined && value < min - tol) return min - value;
	if (max !== undefined && value > max + tol) return value - max;
	return 0;
}

function ranged(target: Target, value: number | null, reason: string): TargetResult {
	const asked = askedText(target);
	const unit = TARGET_LABELS[target.kind].unit;
	if (value === null) return { kind: target.kind, asked, value: null, met: null, missedBy: null, unit, text: reason };
	const missedBy = outsideBy(value, target.min, target.max);
	const shown = show(target.kind, value);
	const below = target.min !== undefined && value < target.min;
	const text = missedBy === 0 ? `${shown}: met.` : `${shown}: not met, ${distance(target.kind, missedBy)} ${below ? 'below' : 'above'} the range.`;
	return { kind: target.kind, asked, value, met: missedBy === 0, missedBy, unit, text };
}

/** Lights that give light of their own (flashes and continuous lights); reflectors only return it. */
export function emitterCount(scene: ExposureScene): number {
	return scene.lights.filter((l) => l.kind !== 'reflector').length;
}

/**
 * The angle at the subject between the key light and the camera, degrees: 0 is a light on the lens
 * axis, 90 side light, above 90 back light. Null without a camera position or a key light with one.
 */
export function keyLightAngleDeg(scene: ExposureScene, exposure: ExposureResult): number | null {
	const camera = scene.camera.position as Vec3 | undefined;
	const key = scene.lights.find((l) => l.id === exposure.keyLightId);
	if (!camera || !key) return null;
	const subject = scene.subject.position as Vec3;
	return angleBetweenDeg(subtract3(key.position as Vec3, subject), subtract3(camera, subject));
}

/**
 * The power each flash would need for a correct exposure at the marked aperture, all flashes scaled by
 * one factor (their ratios kept, as a photographer turns a group up or down). Exposure from flash is
 * proportional to power (X ∝ GN² ∝ power), so with flash light F and shutter-timed light A at the
 * subject, the factor is (1 − A) / F. Null when there is no flash light, or the ambient alone is
 * already at or above a correct exposure.
 */
export function neededFlashPowers(scene: ExposureScene, exposure: ExposureResult): { id: string; needed: number; lowest: number }[] | null {
	const flashX = exposure.lights.filter((l) => l.group === 'flash').reduce((s, l) => s + l.x, 0);
	const shutterX = exposure.total.x - flashX;
	if (!(flashX > 0) || shutterX >= 1) return null;
	const factor = (1 - shutterX) / flashX;
	return scene.lights
		.filter((l): l is FlashLight => l.kind === 'flash')
		.map((f) => ({ id: f.id, needed: f.power * factor, lowest: powerLadder[lowestLadderStep(f.lowestPower ?? LOWEST_POWER)].fraction }));
}

export function evaluateTarget(target: Target, scene: ExposureScene, exposure: ExposureResult): TargetResult {
	switch (target.kind) {
		case 'exposureOffset':
			return ranged(target, exposure.total.exposureOffsetStops, 'No light reaches the subject, so there is no exposure to compare.');
		case 'lightingRatio':
			return ranged(target, exposure.lightingRatio, 'There is no lighting ratio: fewer than two lights reach the subject.');
		case 'aperture':
			return ranged(target, scene.camera.aperture, '');
		case 'lightCount':
			return ranged(target, emitterCount(scene), '');
		case 'keyLightAngle': {
			const angle = keyLightAngleDeg(scene, exposure);
			return ranged(target, angle, 'The angle cannot be told: place the camera on the plan and light the subject.');
		}
		case 'depthOfField':
			return depthOfFieldResult(target, scene, exposure);
		case 'flashPower':
			return flashPowerResult(target, scene, exposure);
	}
}

function depthOfFieldResult(target: Target, scene: ExposureScene, exposure: ExposureResult): TargetResult {
	const base = { kind: target.kind, asked: askedText(target), unit: 'mm' };
	const depthMm = scene.subject.depthMm;
	const m = scene.camera.magnification;
	if (!depthMm) return { ...base, value: null, met: null, missedBy: null, text: "Give the subject's depth to compare it with the depth of field." };
	if (!(m > 0)) return { ...base, value: null, met: null, missedBy: null, text: 'Set a magnification to work out the close-up depth of field.' };
	const dofMm = depthOfFieldFromWorkingMm(exposure.workingAperture, m, exposure.cocMm);
	const missedBy = dofMm >= depthMm * (1 - SLACK) ? 0 : depthMm - dofMm;
	const text =
		missedBy === 0
			? `${round(dofMm, 2)} mm for a subject ${round(depthMm, 2)} mm deep: met.`
			: `${round(dofMm, 2)} mm for a subject ${round(depthMm, 2)} mm deep: not met, ${round(missedBy, 2)} mm short (stop down or focus-stack).`;
	return { ...base, value: dofMm, met: missedBy === 0, missedBy, text };
}

function flashPowerResult(target: Target, scene: ExposureScene, exposure: ExposureResult): TargetResult {
	const base = { kind: target.kind, asked: askedText(target), unit: 'stops' };
	const needed = neededFlashPowers(scene, exposure);
	if (!needed || !needed.length) {
		return { ...base, value: null, met: null, missedBy: null, text: 'No flash light reaches the subject, or the ambient alone is already enough.' };
	}
	// Stops beyond full power, or below the lowest step, of the flash furthest out of its range.
	let worst = { id: needed[0].id, stops: 0, needed: needed[0].needed };
	for (const n of needed) {
		const over = n.needed > 1 ? Math.log2(n.needed) : n.needed < n.lowest ? Math.log2(n.lowest / n.needed) : 0;
		if (over > worst.stops + 1e-9) worst = { id: n.id, stops: over, needed: n.needed };
	}
	const key = needed.find((n) => n.id === exposure.keyLightId) ?? needed[0];
	const fraction = (p: number) => (p >= 1 ? `${round(p, 2)}× full power` : `1/${round(1 / p, 1)} power`);
	const met = worst.stops < 1e-6;
	const text = met
		? `Flash “${key.id}” needs ${fraction(key.needed)} for a correct exposure: within its range, met.`
		: `Flash “${worst.id}” would need ${fraction(worst.needed)}: not met, ${round(worst.stops, 2)} stops ${worst.needed > 1 ? 'beyond full power' : 'below its lowest step'}.`;
	return { ...base, value: met ? 0 : worst.stops, met, missedBy: met ? 0 : worst.stops, text };
}

/** Every target of an exercise on one scene; the exposure is worked out once unless given. */
export function evaluateTargets(targets: readonly Target[], scene: ExposureScene, exposure: ExposureResult = computeExposure(scene)): TargetResult[] {
	return targets.map((t) => evaluateTarget(t, scene, exposure));
}

/** "2 of 3 met" counts: met, evaluated (met or not met). */
export function targetTally(results: readonly TargetResult[]): { met: number; total: number } {
	return { met: results.filter((r) => r.met === true).length, total: results.length };
}
