/**
 * The editor's live exposure: the plan's scene checked by the API's own schema and computed by the
 * engine in the browser, on every change, with no request. The server recomputes the same from the
 * stored document when the plan is saved and for the API.
 */
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { exposureSceneSchema, type ExposureScene } from '$lib/light/schema';

export type LiveExposure = { ok: true; result: ExposureResult } | { ok: false; message: string };

export function liveExposure(scene: ExposureScene): LiveExposure {
	const parsed = exposureSceneSchema.safeParse(scene);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		return { ok: false, message: `${issue.path.join('.')}: ${issue.message}` };
	}
	return { ok: true, result: computeExposure(parsed.data) };
}
