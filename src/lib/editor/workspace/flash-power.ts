/**
 * The power each flash would need for a correct exposure at the set aperture on its own, rounded to
 * the flash's real steps: shown by the exposure strip and the full exposure panel.
 */
import { nearestPowerStep, powerWithinRange } from '$lib/light/flash';
import type { ExposureResult } from '$lib/light/scene';
import type { ExposureScene } from '$lib/light/schema';

export interface FlashPowerNeeded {
	id: string;
	label: string;
	/** Fraction of full power. */
	power: number;
	stepLabel: string;
	/** Stops the nearest step leaves over (+) or under (−). */
	residual: number;
	within: boolean;
}

export function flashPowersNeeded(scene: ExposureScene, result: ExposureResult, labels: Record<string, string>): FlashPowerNeeded[] {
	const out: FlashPowerNeeded[] = [];
	for (const light of scene.lights) {
		if (light.kind !== 'flash') continue;
		const r = result.lights.find((l) => l.id === light.id);
		if (!r || r.blocked || !(r.x > 0)) continue;
		// X scales with power (/api/v1/openapi.json: X = (GN·√power… / (d·N_w))², so X ∝ power).
		const required = light.power / r.x;
		// The ladder ends at this flash's lowest step (the shelf's), not at the lowest any flash has.
		const step = nearestPowerStep(required, light.lowestPower);
		out.push({ id: light.id, label: labels[light.id] ?? light.id, power: required, stepLabel: step.label, residual: step.residualStops, within: powerWithinRange(required, light.lowestPower) });
	}
	return out;
}
