import { calculationRoute } from '../respond';

/** POST /api/v1/calc/ambient (see /api/v1/openapi.json); the schema and engine call are in $lib/light/calculations. */
export const POST = calculationRoute('/api/v1/calc/ambient');
