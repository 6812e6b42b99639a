/**
 * The calculation routes (/api/v1/openapi.json) as plain functions: each route's schema and engine call, keyed by its
 * path. The JSON routes serve them over HTTP; the calculator's form actions call them directly, so a
 * page view does not make internal HTTP requests (nor the session look-ups that come with them).
 */
import type { z } from 'zod';
import { ambientCalc } from './ambient';
import { colourCalc } from './colour';
import { findNonFinite } from './finite';
import { flashCalc } from './flash';
import { opticsCalc } from './optics';
import { computeExposure } from './scene';
import { ambientCalcSchema, colourCalcSchema, exposureSceneSchema, flashCalcSchema, opticsCalcSchema } from './schema';

export interface Calculation<S extends z.ZodType> {
	schema: S;
	compute: (input: z.output<S>) => unknown;
}

const define = <S extends z.ZodType>(schema: S, compute: (input: z.output<S>) => unknown): Calculation<S> => ({ schema, compute });

export const CALCULATIONS = {
	'/api/v1/calc/flash': define(flashCalcSchema, flashCalc),
	'/api/v1/calc/optics': define(opticsCalcSchema, opticsCalc),
	'/api/v1/calc/ambient': define(ambientCalcSchema, ambientCalc),
	'/api/v1/calc/colour': define(colourCalcSchema, colourCalc),
	'/api/v1/exposure': define(exposureSceneSchema, computeExposure)
} as const;

export type CalculationPath = keyof typeof CALCULATIONS;

export interface CalculationIssue {
	path: string[];
	message: string;
}

export type CalculationOutcome =
	| { ok: true; data: unknown }
	| { ok: false; stage: 'input' | 'compute'; message: string; issues: CalculationIssue[] };

/**
 * Runs an engine call on input already validated, and checks the answer is finite. Never throws: an
 * unexpected error or a non-finite number becomes a refusal that says what went wrong.
 */
export function computeSafely<S extends z.ZodType>(calc: Calculation<S>, input: z.output<S>): CalculationOutcome {
	let data: unknown;
	try {
		data = calc.compute(input);
	} catch (e) {
		return couldNotCompute(e);
	}
	const bad = findNonFinite(data);
	if (bad) return notFinite(bad);
	return { ok: true, data };
}

function couldNotCompute(e: unknown): Extract<CalculationOutcome, { ok: false }> {
	const why = e instanceof Error ? e.message : 'unknown error';
	return { ok: false, stage: 'compute', message: `These values could not be worked out: ${why}`, issues: [{ path: [], message: why }] };
}

function notFinite(bad: string[]): Extract<CalculationOutcome, { ok: false }> {
	return {
		ok: false,
		stage: 'compute',
		message: `These values give no finite result (${bad.join('.')}); check the inputs are in range.`,
		issues: [{ path: [], message: `no finite value for ${bad.join('.')}` }]
	};
}

/** Validates a raw body and computes: the whole route without HTTP. */
export function runCalculation(path: CalculationPath, raw: unknown): CalculationOutcome {
	const calc = CALCULATIONS[path] as Calculation<z.ZodType>;
	const parsed = calc.schema.safeParse(raw);
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message }));
		return { ok: false, stage: 'input', message: issues[0]?.message ?? 'Invalid input', issues };
	}
	return computeSafely(calc, parsed.data);
}
