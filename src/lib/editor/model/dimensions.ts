/**
 * Dimension lines from each light and card to the subject, with the true 3-D distance (the plan
 * shows x and y; the heights make the rest), as a technical drawing would mark them.
 */
import { formatDistance, type UnitSystem } from '$lib/light/format';
import type { EditorModel, Vec2 } from './types';
import { elementsInOrder, subjectOf } from './types';

export interface DimensionLine {
	id: string;
	from: Vec2;
	to: Vec2;
	distance3dM: number;
	planDistanceM: number;
	/** Element height minus subject height. */
	heightDifferenceM: number;
	label: string;
	/** e.g. "12 cm above": shown when the heights differ by more than a millimetre. */
	heightLabel: string | null;
}

export function dimensionLines(model: EditorModel, system: UnitSystem): DimensionLine[] {
	const subject = subjectOf(model);
	if (!subject) return [];
	const out: DimensionLine[] = [];
	for (const el of elementsInOrder(model)) {
		if (el.kind !== 'flash' && el.kind !== 'continuous' && el.kind !== 'reflector') continue;
		const dx = el.xM - subject.xM;
		const dy = el.yM - subject.yM;
		const dz = el.heightM - subject.heightM;
		const planDistanceM = Math.hypot(dx, dy);
		const distance3dM = Math.hypot(dx, dy, dz);
		out.push({
			id: el.id,
			from: [el.xM, el.yM],
			to: [subject.xM, subject.yM],
			distance3dM,
			planDistanceM,
			heightDifferenceM: dz,
			label: formatDistance(distance3dM, system),
			heightLabel: Math.abs(dz) > 0.001 ? `${formatDistance(Math.abs(dz), system)} ${dz > 0 ? 'above' : 'below'}` : null
		});
	}
	return out;
}
