/** The plan editor's public surface for the page (the Konva components are imported on their own, in the browser). */
export { Editor, type DocumentIn, type EditorOptions, type LengthParse } from './editor.svelte';
export { setEditorContext, getEditorContext, hasEditorContext } from './context';
export * as commands from './commands';
export type { Command, CommandError, CommandResult } from './commands';
export { SHORTCUTS, type Shortcut } from './tools/shortcuts';
export type { PlanKeyInput, PlanPointerInput, PlanWheelInput, ToolId } from './tools/types';
export { KIND_LABELS, MODIFIER_PRESETS, DEFAULT_FLASH_KELVIN, DEFAULT_CONTINUOUS_KELVIN } from './model/defaults';
export { ELEMENT_KINDS } from './model/schema';
export type * from './model/schema';
export type { EditorModel } from './model/types';
export { toExposureScene, excludedElements } from './model/scene';
export { modelFromDocument, documentFromModel, planFromModel, type SetupDocument, type Plan } from './model/document';
export { modelFromScene, emptySetupScene } from './model/layout';
export { modifierFromShelf, shelfModifiers, shelfGear, type ShelfItem } from './model/shelf';
export { FALLOFF_LEGEND_STOPS, falloffColour, FALLOFF_PALETTE_LIGHT, FALLOFF_PALETTE_DARK } from './falloff';
export { kelvinToHex, kelvinToRgb } from './kelvin-colour';
