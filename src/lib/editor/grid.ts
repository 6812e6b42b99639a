/**
 * The grid and the scale bar in real units: metric steps of 1, 2 and 5 × 10ⁿ m; imperial steps in
 * inches and feet. The minor grid step is also the snapping step.
 */
import { formatDistance, type UnitSystem } from '$lib/light/format';
import { METRES_PER_FOOT, METRES_PER_INCH } from '$lib/light/constants';
import { visibleBounds, type Viewport } from './viewport';

/** Grid lines closer than this on screen are not drawn; the next coarser step is used. */
export const MIN_GRID_SPACING_PX = 12;

export interface GridSteps {
	minorM: number;
	majorM: number;
}

const IMPERIAL_STEPS_IN: readonly [minor: number, major: number][] = [
	[1 / 16, 1],
	[1 / 8, 1],
	[1 / 4, 1],
	[1 / 2, 6],
	[1, 12],
	[3, 12],
	[6, 36],
	[12, 60],
	[24, 120],
	[60, 600],
	[120, 1200],
	[600, 6000]
];

export function gridSteps(system: UnitSystem, zoomPxPerM: number, minSpacingPx = MIN_GRID_SPACING_PX): GridSteps {
	if (system === 'imperial') {
		for (const [minor, major] of IMPERIAL_STEPS_IN) {
			if (minor * METRES_PER_INCH * zoomPxPerM >= minSpacingPx) return { minorM: minor * METRES_PER_INCH, majorM: major * METRES_PER_INCH };
		}
		const last = IMPERIAL_STEPS_IN.at(-1)!;
		return { minorM: last[0] * METRES_PER_INCH, majorM: last[1] * METRES_PER_INCH };
	}
	const target = minSpacingPx / zoomPxPerM;
	for (let k = Math.floor(Math.log10(target)); ; k++) {
		for (const f of [1, 2, 5]) {
			const minorM = Number((f * 10 ** k).toPrecision(12));
			if (minorM >= target) return { minorM, majorM: Number((10 ** (k + 1)).toPrecision(12)) };
		}
	}
}

export interface GridLines {
	/** Plan x of each vertical line, y of each horizontal line, in metres. */
	xs: number[];
	ys: number[];
	majorXs: number[];
	majorYs: number[];
}

/** Lines of the grid in view (at most a few hundred). */
export function gridLines(v: Viewport, widthPx: number, heightPx: number, steps: GridSteps): GridLines {
	const b = visibleBounds(v, widthPx, heightPx);
	const along = (min: number, max: number, step: number) => {
		const out: number[] = [];
		const first = Math.ceil(min / step);
		const last = Math.floor(max / step);
		if (last - first > 2000) return out;
		for (let i = first; i <= last; i++) out.push(Math.round(i * step * 1e9) / 1e9);
		return out;
	};
	const isMajor = (value: number) => Math.abs(value / steps.majorM - Math.round(value / steps.majorM)) < 1e-6;
	const xs = along(b.minX, b.maxX, steps.minorM);
	const ys = along(b.minY, b.maxY, steps.minorM);
	return { xs, ys, majorXs: xs.filter(isMajor), majorYs: ys.filter(isMajor) };
}

/** Round a plan coordinate to the grid. */
export function snapToGrid(valueM: number, stepM: number): number {
	return Math.round(valueM / stepM) * stepM;
}

const METRIC_BARS_M = [0.001, 0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50];
const IMPERIAL_BARS_M = [
	...[1 / 16, 1 / 8, 1 / 4, 1 / 2, 1, 2, 3, 6].map((i) => i * METRES_PER_INCH),
	...[1, 2, 3, 5, 10, 20, 50].map((f) => f * METRES_PER_FOOT)
];

export interface ScaleBar {
	lengthM: number;
	lengthPx: number;
	label: string;
}

/** The longest round length that fits in `maxPx` on screen (at least the shortest step). */
export function scaleBar(system: UnitSystem, zoomPxPerM: number, maxPx = 140): ScaleBar {
	const lengths = system === 'imperial' ? IMPERIAL_BARS_M : METRIC_BARS_M;
	let lengthM = lengths[0];
	for (const l of lengths) if (l * zoomPxPerM <= maxPx) lengthM = l;
	return { lengthM, lengthPx: lengthM * zoomPxPerM, label: formatDistance(lengthM, system) };
}

/** Ruler marks along one edge of the paper: short ticks, and a number on every `numberStepM`. */
export interface RulerMarks {
	ticksM: number[];
	numberStepM: number;
	/** The unit the numbers are in ("cm" or "in"), and how to turn metres into it. */
	unit: 'cm' | 'in';
	perM: number;
}

/**
 * The paper's rulers: a tick every centimetre (every inch), coarser when they would crowd (at least
 * 5 px apart), and a number every 10 cm (every 6 in), coarser when numbers would crowd (40 px).
 */
export function rulerMarks(system: UnitSystem, zoomPxPerM: number, fromM: number, toM: number): RulerMarks {
	const tickM = Math.max(gridSteps(system, zoomPxPerM, 5).minorM, system === 'imperial' ? METRES_PER_INCH : 0.01);
	const numberStepM = Math.max(gridSteps(system, zoomPxPerM, 40).minorM, system === 'imperial' ? 6 * METRES_PER_INCH : 0.1);
	const ticksM: number[] = [];
	for (let i = Math.ceil(fromM / tickM); i * tickM <= toM && ticksM.length < 2000; i++) ticksM.push(i * tickM);
	return { ticksM, numberStepM, unit: system === 'imperial' ? 'in' : 'cm', perM: system === 'imperial' ? 1 / METRES_PER_INCH : 100 };
}
