/**
 * The calculator's questions, answered as the page answers them (fields typed as text, the route's
 * schema and engine run directly): one working aperture everywhere, words without double negatives,
 * the flash's own lowest step, the card on the shadow face, the trade's gel.
 */
import { describe, expect, it } from 'vitest';
import { runCalculation, type CalculationPath } from '$lib/light/calculations';
import { answerQuestion, type Send } from '../compute';
import { initialValues } from '../fields';
import { balanceQuestion } from './balance';
import { bounceQuestion } from './bounce';
import { shiftQuestion } from './colour';
import { flashQuestion } from './flash';
import { opticsQuestion } from './optics';
import type { Answer, Question } from './types';

const send: Send = async (route, body) => {
	const outcome = runCalculation(route as CalculationPath, body);
	return outcome.ok ? outcome : { ok: false, message: outcome.message, issues: outcome.issues };
};

async function answer(question: Question, typed: Record<string, string>): Promise<Answer> {
	const outcome = await answerQuestion(question, { ...initialValues(question.fields, 'metric'), ...typed }, 'metric', send);
	if (!outcome.ok) throw new Error(JSON.stringify(outcome.errors));
	return outcome.answer;
}
const fact = (a: Answer, label: string) => a.facts.find((f) => f.label === label)?.value;
const text = (a: Answer) => [a.headline, ...a.facts.map((f) => f.value), ...a.working, ...a.warnings].join('\n');

describe('one working aperture for every question (issue 15, item 3)', () => {
	it('f/16 at 1:1 with P = 0.6 works at f/42.7 in the flash, balance and bounce questions alike', async () => {
		// Source: N(1 + m/P) = 16 × (1 + 1/0.6) = 42.67 (The Manual of Photography, close-up chapter; from memory).
		const lens = { aperture: 'f/16', magnification: '1:1', pupilMagnification: '0.6' };
		const flash = await answer(flashQuestion, lens);
		const balance = await answer(balanceQuestion, lens);
		const bounce = await answer(bounceQuestion, lens);
		expect(fact(flash, 'Working aperture')).toBe('f/42.7');
		expect(fact(balance, 'Working aperture')).toBe('f/42.7');
		expect(bounce.working.join(' ')).toContain('(working f/42.7)');
	});

	it('a close-up lens costs no light in every question (issue 15, item 1)', async () => {
		// Source: a dioptre on a lens at infinity leaves N_w = N (from memory, the usual close-up lens treatment).
		const lens = { aperture: 'f/16', magnification: '0.4', magnificationBy: 'close-up-lens' };
		expect(fact(await answer(flashQuestion, lens), 'Working aperture')).toBe('f/16');
		expect(fact(await answer(balanceQuestion, lens), 'Working aperture')).toBe('f/16');
		expect(fact(await answer(opticsQuestion, lens), 'Light lost')).toBe('0 stops');
	});
});

describe('words (issue 15, item 12)', () => {
	it('no sign that contradicts its word, and "1 stop" in the singular', async () => {
		// f/16 at 1:2 from 30 cm with GN 32: 0.3 × 24 = 7.2, (7.2/32)² = 0.0506 → 1/16 +0.3 (0.0496), 0.03 stop under.
		const a = await answer(flashQuestion, {});
		expect(text(a)).not.toMatch(/−[\d.]+ stops? (under|short)/);
		expect(text(a)).not.toMatch(/\+[\d.]+ stops? over/);
		const short = await answer(flashQuestion, { distance: '2 m', guideNumber: '16' });
		expect(short.headline).toMatch(/^Full power is not enough: [\d.]+ stops short$/);
	});

	it('a flash that stops at 1/128 is told so, never 1/256 (issue 15, item 7)', async () => {
		const a = await answer(flashQuestion, { guideNumber: '60', distance: '1 m', aperture: 'f/2.8', magnification: '0', lowestPower: '7' });
		expect(a.headline).toMatch(/^Even 1\/128 is too strong: [\d.]+ stops over$/);
		expect(text(a)).not.toContain('1/256');
	});

	it('a suggested aperture beyond the lens is flagged', async () => {
		// GN 32 at 30 cm, 1:2: full power wants f/106 working, f/71 marked; the lens stops at f/32.
		const a = await answer(flashQuestion, {});
		expect(fact(a, 'Marked aperture at full power')).toMatch(/beyond the lens/);
		expect(a.warnings.join(' ')).toMatch(/narrower than this lens goes \(f\/32\)/);
	});

	it('the gel question suggests the trade’s gel for +131 mired and shows its loss, with the gel caution', async () => {
		const a = await answer(shiftQuestion, {});
		expect(a.headline).toBe('+131 mired: ½ CTO + ⅛ CTO');
		expect(fact(a, 'Light lost')).toBe('about 0.6 stops');
		expect(a.working.join(' ')).toContain('full CTO');
		expect(a.cautions).toHaveLength(1);
	});

	it('the balance question gives the flash compensation that keeps the sum correct', async () => {
		// Source: exposures add (common practice): ambient 1 stop under the flash adds log2(1.5) = 0.585 stop.
		const a = await answer(balanceQuestion, { balanceUnderStops: '1' });
		expect(fact(a, 'Flash compensation for a correct sum')).toBe('-0.58 EV');
		const even = await answer(balanceQuestion, { balanceUnderStops: '0' });
		expect(even.working.join(' ')).toContain('the two together are 1 stop over');
	});
});

describe('the card fills the shadow face (issue 15, item 4)', () => {
	it('says the card lights the shadow face, not the key’s, and gives key : fill', async () => {
		const a = await answer(bounceQuestion, {});
		expect(a.headline).toMatch(/^The card fills the shadow side at −[\d.]+ stops: a [\d.]+:1 lighting ratio$/);
		expect(text(a)).not.toMatch(/adds/);
		expect(fact(a, 'Lighting ratio (key : fill)')).toMatch(/:1$/);
	});
});

describe('the subject has depth (issue 15, item 9)', () => {
	it('the flash question gives the falloff from front to back', async () => {
		const a = await answer(flashQuestion, { distance: '10 cm', subjectDepthMm: '18 mm' });
		expect(a.working.join(' ')).toContain('= 0.52 stops more on the front than on the back');
	});
});
