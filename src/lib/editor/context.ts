/**
 * The editor state handed down the page's component tree (never a module singleton: SSR would share
 * it between requests). `setEditorContext` in the page, `getEditorContext` in the panels and stage.
 */
import { getContext, hasContext, setContext } from 'svelte';
import type { Editor } from './editor.svelte';

const KEY = Symbol('squarelaw-editor');

export function setEditorContext(editor: Editor): Editor {
	return setContext(KEY, editor);
}

export function getEditorContext(): Editor {
	if (!hasContext(KEY)) throw new Error('getEditorContext: no editor here; call setEditorContext(editor) in the page first');
	return getContext<Editor>(KEY);
}

export function hasEditorContext(): boolean {
	return hasContext(KEY);
}
