/**
 * Which gear-shelf items a document's plan refers to. Plain functions apart from the document's
 * schemas (document.ts re-exports them), so the pages' first loads can use them without zod.
 */
import type { PlanElement, SetupDocument } from './document';

/**
 * The gear ids one plan element refers to: its own `gearId`, and those of what the editor fitted to it,
 * fields it writes beside the document's own: a light's modifier (`modifier.gearId`) and a camera's
 * lens (`lens.gearId`).
 */
function gearIdsOf(el: PlanElement): string[] {
	const fittedId = (key: 'modifier' | 'lens') => {
		const fitted = (el as Record<string, unknown>)[key];
		const id = fitted && typeof fitted === 'object' ? (fitted as { gearId?: unknown }).gearId : undefined;
		return typeof id === 'string' ? id : undefined;
	};
	return [el.gearId, fittedId('modifier'), fittedId('lens')].filter((id): id is string => Boolean(id));
}

/** Every gear id the plan refers to, in a stable order. */
export function referencedGearIds(doc: Pick<SetupDocument, 'plan'>): string[] {
	const ids = new Set<string>();
	for (const el of Object.values(doc.plan.elements ?? {})) for (const id of gearIdsOf(el)) ids.add(id);
	return [...ids].sort();
}

/** The plan element id that refers to a gear id (for error paths). */
export function elementUsingGear(doc: Pick<SetupDocument, 'plan'>, gearId: string): string | undefined {
	return Object.entries(doc.plan.elements ?? {}).find(([, el]) => gearIdsOf(el).includes(gearId))?.[0];
}
