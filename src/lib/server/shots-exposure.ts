// Predicted against actual for shots: the revision's scene recomputed by the engine at the shot's own
// aperture, shutter and ISO (a calibrated flash carries its offset in the scene), and the flash's share
// of that light, which a calibration from a shot needs.
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import type { SetupDocument } from '$lib/scene/document';
import { SETTING_WORDS, type ShotExif, type ShotTyped, type TypedField } from '$lib/shots/types';
import { readStoredDocument } from './setups-documents';

export interface ShotSettings {
	fNumber: number | null;
	exposureTimeS: number | null;
	iso: number | null;
	focalLengthMm: number | null;
	/** Where each value came from: EXIF, typed by hand, or not recorded. */
	sources: Record<TypedField, 'exif' | 'typed' | 'not recorded'>;
}

/** The settings a shot was made at: typed values win over EXIF. */
export function shotSettings(exif: ShotExif, typed: ShotTyped): ShotSettings {
	const pick = (field: TypedField) => {
		if (typed[field] !== undefined) return { value: typed[field]!, source: 'typed' as const };
		const recorded = exif[field];
		return recorded !== null ? { value: recorded, source: 'exif' as const } : { value: null, source: 'not recorded' as const };
	};
	const f = pick('fNumber');
	const t = pick('exposureTimeS');
	const iso = pick('iso');
	const focal = pick('focalLengthMm');
	return {
		fNumber: f.value,
		exposureTimeS: t.value,
		iso: iso.value,
		focalLengthMm: focal.value,
		sources: { fNumber: f.source, exposureTimeS: t.source, iso: iso.source, focalLengthMm: focal.source }
	};
}

export type Prediction =
	| { ok: true; offsetStops: number | null; result: ExposureResult; document: SetupDocument }
	| { ok: false; reason: string };

/** The stored revision's exposure at the shot's settings, or why there is none. */
export function predictShot(storedDocument: unknown, settings: ShotSettings): Prediction {
	const missing = (['fNumber', 'exposureTimeS', 'iso'] as const).filter((f) => settings[f] === null);
	if (missing.length) return { ok: false, reason: `not recorded: ${missing.map((f) => SETTING_WORDS[f]).join(', ')} (type them in)` };
	const read = readStoredDocument(storedDocument);
	if (read.documentIssues) return { ok: false, reason: 'the revision’s document does not pass today’s checks' };
	const scene = read.document.scene;
	const result = computeExposure({
		...scene,
		camera: { ...scene.camera, aperture: settings.fNumber!, shutter: settings.exposureTimeS!, iso: settings.iso! }
	});
	return { ok: true, offsetStops: result.total.exposureOffsetStops, result, document: read.document };
}

/**
 * The share of the predicted light at the subject that comes from the lights drawn from one gear-shelf
 * flash, and the calibration (stops) the prediction already used for them.
 */
export function flashShareOf(prediction: Extract<Prediction, { ok: true }>, gearId: string) {
	const lights = prediction.document.scene.lights.filter((l) => l.kind === 'flash' && prediction.document.plan.elements?.[l.id]?.gearId === gearId);
	const lightIds = new Set(lights.map((l) => l.id));
	const total = prediction.result.total.x;
	const flash = prediction.result.lights.filter((l) => lightIds.has(l.id)).reduce((s, l) => s + l.x, 0);
	const first = lights[0];
	const offsetStops = first?.kind === 'flash' ? (first.calibrationOffsetStops ?? 0) : 0;
	return { lightIds: [...lightIds], share: total > 0 ? flash / total : 0, offsetStops };
}
