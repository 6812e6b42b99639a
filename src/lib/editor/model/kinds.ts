/**
 * The kinds of element the editor draws. Apart from the element schemas (schema.ts, which re-exports
 * them) so that code of the editor's first load can name the kinds without bringing zod.
 */
export const ELEMENT_KINDS = ['subject', 'camera', 'flash', 'continuous', 'reflector', 'diffuser', 'flag', 'ambient', 'background'] as const;
export type ElementKind = (typeof ELEMENT_KINDS)[number];
