import { calculationRoute } from '../calc/respond';

/** POST /api/v1/exposure (see /api/v1/openapi.json): a whole scene in one call; see $lib/light/scene. */
export const POST = calculationRoute('/api/v1/exposure');
