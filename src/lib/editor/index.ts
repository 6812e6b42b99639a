/**
 * The plan editor's public surface for the page (the Konva components are imported on their own, in the
 * browser). Nothing here brings the element schemas (zod), which the setup page's first load leaves
 * out: reading a document into the model (`openDocument`, model/document.ts), the commands that set
 * what a user types (commands-properties.ts) and the gear shelf's modifiers (model/shelf.ts) are
 * imported from their own modules.
 */
export { Editor, type EditorOptions, type LengthParse } from './editor.svelte';
export type { DocumentIn } from './model/document';
export { setEditorContext, getEditorContext, hasEditorContext } from './context';
export * as commands from './commands';
export type { Command, CommandError, CommandResult } from './commands';
export { SHORTCUTS, type Shortcut } from './tools/shortcuts';
export type { PlanKeyInput, PlanPointerInput, PlanWheelInput, ToolId } from './tools/types';
export { KIND_LABELS, MODIFIER_PRESETS, DEFAULT_FLASH_KELVIN, DEFAULT_CONTINUOUS_KELVIN } from './model/defaults';
export { ELEMENT_KINDS } from './model/kinds';
export type * from './model/schema';
export type { EditorModel } from './model/types';
export type { OpenedDocument, ReadResult } from './model/document';
export { toExposureScene, excludedElements } from './model/scene';
export { documentFromModel, planFromModel } from './model/to-document';
export type { SetupDocument, Plan } from './model/document';
export { modelFromScene, emptySetupScene } from './model/layout';
export { FALLOFF_LEGEND_STOPS, falloffColour, FALLOFF_PALETTE_LIGHT, FALLOFF_PALETTE_DARK } from './falloff';
export { kelvinToHex, kelvinToRgb } from './kelvin-colour';
