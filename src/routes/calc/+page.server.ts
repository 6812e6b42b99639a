import { fail, type Actions } from '@sveltejs/kit';
import { initialValues, type FieldValues } from './fields';
import { runCalculation, type CalculationPath } from '$lib/light/calculations';
import { answerQuestion, type Send } from './compute';
import { QUESTIONS, questionById } from './questions';
import { calculatorUnitSystem, isUnitSystem, rememberCalculatorUnits, unitSystemFor } from '$lib/server/unit-preference';
import type { PageServerLoad } from './$types';

/** On the server the route's schema and engine run in-process: the same answer, no internal request. */
const sendDirect: Send = async (route, body) => {
	const outcome = runCalculation(route as CalculationPath, body);
	return outcome.ok ? outcome : { ok: false, message: outcome.message, issues: outcome.issues };
};

export const load: PageServerLoad = async ({ locals, cookies }) => {
	const units = calculatorUnitSystem(locals, cookies);
	// Every question is answered for its starting values, so the page is useful before anyone types and
	// without JavaScript.
	const initial = await Promise.all(
		QUESTIONS.map(async (q) => {
			const values = initialValues(q.fields, units);
			return [q.id, { values, outcome: await answerQuestion(q, values, units, sendDirect) }] as const;
		})
	);
	// The account's own choice, so the page can say when it shows other units.
	return { units, accountUnits: locals.user ? unitSystemFor(locals, cookies) : null, initial: Object.fromEntries(initial) };
};

function formValues(data: FormData): FieldValues {
	const values: FieldValues = {};
	for (const [k, v] of data) if (typeof v === 'string') values[k] = v.slice(0, 200);
	return values;
}

/** One named action per question: the no-JavaScript path, through the same API route. */
function questionAction(id: string): Actions[string] {
	return async ({ request, locals, cookies }) => {
		const question = questionById(id)!;
		const units = calculatorUnitSystem(locals, cookies);
		const values = formValues(await request.formData());
		const outcome = await answerQuestion(question, values, units, sendDirect);
		if (!outcome.ok) return fail(400, { question: id, values, errors: outcome.errors });
		return { question: id, values, answer: outcome.answer };
	};
}

export const actions: Actions = {
	...Object.fromEntries(QUESTIONS.map((q) => [q.id, questionAction(q.id)])),
	/** Units for this page only: the account's choice is made on the account page and stays as it is. */
	units: async ({ request, cookies }) => {
		const value = (await request.formData()).get('units');
		if (!isUnitSystem(value)) return fail(400, { question: 'units', errors: { units: 'Choose metric or imperial.' } });
		rememberCalculatorUnits(cookies, value);
		return { question: 'units', units: value };
	}
};
