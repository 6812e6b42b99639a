// Column shapes that many tables share (Drizzle's "common columns" pattern). Each one writes the same
// SQL as the column it replaced, so using one never needs a migration. They are functions, not shared
// objects: a column builder keeps the name of the first table it is built for (a unique constraint's
// name among them), so every table needs builders of its own.
import { sql, type SQL } from 'drizzle-orm';
import { timestamp, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';

/** A row's own id: a random UUID made by the database. */
export const uuidKey = () => uuid().primaryKey().defaultRandom();

/** A moment, kept with its time zone (every timestamp of the schema is one). */
export const timestamptz = () => timestamp({ withTimezone: true });

/** The moment the row was written, filled in by the database. */
export const writtenAt = () => timestamptz().notNull().defaultNow();

/** When a row was made and last changed. */
export const timestamps = () => ({ createdAt: writtenAt(), updatedAt: writtenAt() });

/** The row this one belongs to: always set, and this row is deleted with it. */
export const belongsTo = (target: () => AnyPgColumn) => uuid().notNull().references(target, { onDelete: 'cascade' });

/** A row this one names (who made it, a row it came from): may be empty, and is emptied when that row is deleted. */
export const optionalRef = (target: () => AnyPgColumn) => uuid().references(target, { onDelete: 'set null' });

/** A check that a text column holds one of the listed values. */
export const inList = (column: AnyPgColumn, values: readonly string[]): SQL =>
	sql`${column} in (${sql.raw(values.map((v) => `'${v}'`).join(', '))})`;
