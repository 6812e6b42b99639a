import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { calculationRoute } from '../calc/respond';

/** POST /api/v1/exposure (API.md): a whole scene in one call. */
export const POST = calculationRoute(exposureSceneSchema, computeExposure);
