/**
 * A stored plan's fitted entries: a modifier, or a diffuser with no place of its own, fitted to a light
 * (`attachedTo`) is drawn on that light, not on the table, and names the light's modifier. One rule for
 * the editor's reading of a document and for the lights table of the printed sheet and the handout.
 */
type Entry = Record<string, unknown>;

export function isFitted(entry: Entry): boolean {
	return typeof entry.attachedTo === 'string' && (entry.kind === 'modifier' || (entry.kind === 'diffuser' && entry.position === undefined));
}

/** The entry fitted to a light, if one is. */
export function fittedTo(entries: Record<string, Entry>, lightId: string): Entry | undefined {
	return Object.values(entries).find((e) => isFitted(e) && e.attachedTo === lightId);
}
