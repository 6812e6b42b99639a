/**
 * What people type into a field (`30 cm`, `1 ft`, `12 in`, `1/125`, `0.3 m`) parsed with mathjs into SI,
 * and SI numbers formatted back in metric or imperial. Plain numbers are read without mathjs
 * (number-text.ts); browser code that reads a field calls `readLengthM` there, which loads this module
 * only for text that is not a plain number.
 *
 * The parser is a small mathjs instance that knows units and the four operations only. Every node of
 * the parsed expression is checked against a short allow-list before it is evaluated, so a field can
 * hold `1 ft + 2 in` or `1/125` but never a function call or an assignment.
 */
import {
	addDependencies,
	create,
	divideDependencies,
	multiplyDependencies,
	parseDependencies,
	subtractDependencies,
	unaryMinusDependencies,
	unaryPlusDependencies,
	unitDependencies,
	type MathNode,
	type Unit
} from 'mathjs';
import { METRES_PER_FOOT } from './constants';
import { normaliseNumberText, plainNumber, UnitParseError } from './number-text';

export { METRES_PER_FOOT, METRES_PER_INCH } from './constants';
export { UnitParseError } from './number-text';
export * from './format';

const math = create({
	parseDependencies,
	unitDependencies,
	addDependencies,
	subtractDependencies,
	multiplyDependencies,
	divideDependencies,
	unaryMinusDependencies,
	unaryPlusDependencies
});

const MAX_INPUT_LENGTH = 64;
const ALLOWED_OPERATORS = new Set(['add', 'subtract', 'multiply', 'divide', 'unaryMinus', 'unaryPlus']);

function checkNode(node: MathNode) {
	node.traverse((n) => {
		switch (n.type) {
			case 'ConstantNode':
			case 'ParenthesisNode':
				return;
			case 'SymbolNode': {
				const name = (n as unknown as { name: string }).name;
				if (!math.Unit.isValuelessUnit(name)) throw new UnitParseError(`“${name}” is not a unit`);
				return;
			}
			case 'OperatorNode': {
				const fn = (n as unknown as { fn: string }).fn;
				if (!ALLOWED_OPERATORS.has(fn)) throw new UnitParseError(`the operator in “${n.toString()}” is not allowed`);
				return;
			}
			default:
				throw new UnitParseError('only numbers, units and + − × / are allowed');
		}
	});
}

type Parsed = { kind: 'number'; value: number } | { kind: 'unit'; value: Unit };

function evaluateText(text: string): Parsed {
	const trimmed = text.trim().replace(/×/g, '*').replace(/−/g, '-').replace(/,(?=\d{3}\b)/g, '');
	if (!trimmed) throw new UnitParseError('is empty');
	if (trimmed.length > MAX_INPUT_LENGTH) throw new UnitParseError(`is longer than ${MAX_INPUT_LENGTH} characters`);
	const plain = plainNumber(text);
	if (plain !== null) return { kind: 'number', value: plain };
	// A decimal comma ("0,3 m") is common outside the English-speaking world.
	const normalised = normaliseNumberText(text);
	let node: MathNode;
	try {
		node = math.parse(normalised);
	} catch {
		throw new UnitParseError(`“${trimmed}” is not a number or a quantity`);
	}
	checkNode(node);
	let value: unknown;
	try {
		value = node.compile().evaluate({});
	} catch (e) {
		throw new UnitParseError(e instanceof Error ? e.message : 'could not be worked out');
	}
	if (typeof value === 'number') {
		if (!Number.isFinite(value)) throw new UnitParseError('is not a finite number');
		return { kind: 'number', value };
	}
	if (math.isUnit(value)) return { kind: 'unit', value: value as Unit };
	throw new UnitParseError(`“${trimmed}” is not a number or a quantity`);
}

function toBase(parsed: Parsed, base: 'm' | 's', defaultUnit: string): number {
	let unit: Unit;
	if (parsed.kind === 'number') unit = math.unit(parsed.value, defaultUnit);
	else unit = parsed.value;
	if (!unit.equalBase(math.unit(1, base))) {
		throw new UnitParseError(base === 'm' ? 'needs a length (for example 30 cm or 1 ft)' : 'needs a time (for example 1/125 or 2 s)');
	}
	const n = unit.toNumber(base);
	if (!Number.isFinite(n)) throw new UnitParseError('is not a finite number');
	return n;
}

/** A length in metres. A bare number is read in `defaultUnit` (e.g. `cm` for table distances). */
export function parseLengthM(text: string, defaultUnit = 'm'): number {
	return toBase(evaluateText(text), 'm', defaultUnit);
}

/** A small length in millimetres (depth of field, circle of confusion, subject depth). */
export function parseLengthMm(text: string, defaultUnit = 'mm'): number {
	return toBase(evaluateText(text), 'm', defaultUnit) * 1000;
}

/** A time in seconds: `1/125`, `1/125 s`, `0.5`, `2 s`, `500 ms`. A bare number is seconds. */
export function parseTimeS(text: string): number {
	return toBase(evaluateText(text), 's', 's');
}

/** A plain number; fractions and arithmetic allowed (`1/3`, `2.8`), units refused. */
export function parseNumber(text: string): number {
	const parsed = evaluateText(text);
	if (parsed.kind !== 'number') throw new UnitParseError('needs a plain number, without a unit');
	return parsed.value;
}

/** An f-number as people write it: `16`, `f/16`, `f16`, `F/5.6`. */
export function parseFNumber(text: string): number {
	const stripped = text.trim().replace(/^f\s*\/?\s*/i, '');
	return parseNumber(stripped);
}

/** A percentage (`90 %`, `90`) or a fraction (`0.9`) as a fraction 0…1 or more. */
export function parseFraction(text: string): number {
	const t = text.trim();
	if (t.endsWith('%')) return parseNumber(t.slice(0, -1)) / 100;
	const n = parseNumber(t);
	return n > 1 ? n / 100 : n;
}

/** Guide numbers printed in feet (ISO 100) converted to the metres used everywhere else. */
export function guideNumberFeetToMetres(guideNumberFt: number): number {
	return guideNumberFt * METRES_PER_FOOT;
}

export function guideNumberMetresToFeet(guideNumberM: number): number {
	return guideNumberM / METRES_PER_FOOT;
}

