/**
 * Flash calibrations in a setup document: the gear copy of a calibrated flash carries
 * `spec.calibration`, and the scene's light drawn from that flash gets its guide number scaled by
 * measured / rated. Stored documents are never rewritten: the scaling happens when the scene is read.
 */
import type { ExposureScene } from '$lib/light/schema';
import { calibrationOf } from './gear';
import type { SetupDocument } from './document';

export interface CalibratedLight {
	lightId: string;
	gearId: string;
	/** Guide number scale, measured / rated (1 when uncalibrated). */
	scale: number;
	calibratedAt: string;
}

/** Which scene lights come from a calibrated flash of the document's gear copies, and by how much. */
export function calibratedLights(document: Pick<SetupDocument, 'scene' | 'plan' | 'gear'>): CalibratedLight[] {
	const byGear = new Map(document.gear.filter((g) => g.kind === 'flash').map((g) => [g.id, calibrationOf(g.spec)]));
	const out: CalibratedLight[] = [];
	for (const light of document.scene.lights) {
		if (light.kind !== 'flash') continue;
		const gearId = document.plan.elements?.[light.id]?.gearId;
		const cal = gearId ? byGear.get(gearId) : null;
		if (gearId && cal) out.push({ lightId: light.id, gearId, scale: cal.guideNumberM / cal.ratedGuideNumberM, calibratedAt: cal.calibratedAt });
	}
	return out;
}

/** The document's scene with every calibrated flash's guide number scaled (light ∝ GN², so 2·log2(scale) stops). */
export function calibratedScene(document: Pick<SetupDocument, 'scene' | 'plan' | 'gear'>): ExposureScene {
	const scales = new Map(calibratedLights(document).map((c) => [c.lightId, c.scale]));
	if (!scales.size) return document.scene;
	return {
		...document.scene,
		lights: document.scene.lights.map((l) => (l.kind === 'flash' && scales.has(l.id) ? { ...l, guideNumber: l.guideNumber * scales.get(l.id)! } : l))
	};
}
