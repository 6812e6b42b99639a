/**
 * What `PlanFigure` needs once it draws in the browser, in one chunk loaded on demand (Konva and the
 * editor's model stay out of the pages that show a figure until one is in view).
 */
export { default as PlanStage } from '$lib/editor/components/PlanStage.svelte';
export { Editor } from '$lib/editor/editor.svelte';
export { openDocument } from '$lib/editor/model/document';
export { planWithTitleBlock } from '$lib/editor/title-block';
export { visibleDocument } from '$lib/present/step-view';
