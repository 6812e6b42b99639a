import { opticsCalc } from '$lib/light/optics';
import { opticsCalcSchema } from '$lib/light/schema';
import { calculationRoute } from '../respond';

/** POST /api/v1/calc/optics (API.md): working aperture, depth of field, diffraction and a stack plan. */
export const POST = calculationRoute(opticsCalcSchema, opticsCalc);
