import { colourCalc } from '$lib/light/colour';
import { colourCalcSchema } from '$lib/light/schema';
import { calculationRoute } from '../respond';

/** POST /api/v1/calc/colour (API.md): mired shift between two sources, or a gel on a source. */
export const POST = calculationRoute(colourCalcSchema, colourCalc);
