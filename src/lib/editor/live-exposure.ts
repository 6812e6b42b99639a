/**
 * The editor's live exposure: the plan's scene computed by the engine in the browser, on every change,
 * with no request. The scene is built (`toExposureScene`) from elements whose every field the element
 * schemas checked when it was typed or read, within the exposure scene's ranges, so only the scene's
 * rules across fields are checked here (a light dragged onto the subject, a card at its own light);
 * the API's schema is not run again, and zod stays out of the editor's first load. The server checks
 * the whole document with that schema when the plan is saved, and recomputes from it for the API.
 */
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { sceneRuleIssues } from '$lib/light/scene-rules';
import type { ExposureScene } from '$lib/light/schema';

export type LiveExposure = { ok: true; result: ExposureResult } | { ok: false; message: string };

export function liveExposure(scene: ExposureScene): LiveExposure {
	const issue = sceneRuleIssues(scene)[0];
	if (issue) return { ok: false, message: `${issue.path.join('.')}: ${issue.message}` };
	return { ok: true, result: computeExposure(scene) };
}
