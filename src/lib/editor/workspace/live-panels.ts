/**
 * The workspace's panels that show only once the page is live (saving, the camera fields, the shortcut
 * sheet), loaded in one request after the first paint so the editor route's first load stays small.
 */
export { default as CameraSettings } from './CameraSettings.svelte';
export { default as SavePanel } from './SavePanel.svelte';
export { default as ShortcutSheet } from './ShortcutSheet.svelte';
