import { ambientCalc } from '$lib/light/ambient';
import { ambientCalcSchema } from '$lib/light/schema';
import { calculationRoute } from '../respond';

/** POST /api/v1/calc/ambient (API.md): EV at ISO 100, offset, shutter for correct and for a flash balance. */
export const POST = calculationRoute(ambientCalcSchema, ambientCalc);
