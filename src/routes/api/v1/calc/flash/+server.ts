import { flashCalc } from '$lib/light/flash';
import { flashCalcSchema } from '$lib/light/schema';
import { calculationRoute } from '../respond';

/** POST /api/v1/calc/flash (API.md): guide number, distance and aperture → power and apertures. */
export const POST = calculationRoute(flashCalcSchema, flashCalc);
