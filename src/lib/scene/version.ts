/**
 * The setup document's current `schemaVersion` (bump it here; document.ts holds the schema and
 * migrations.ts the steps up to it). A file of its own so the editor can stamp the documents it writes
 * without loading the document's schemas into the browser.
 */
export const CURRENT_SCHEMA_VERSION = 3;
