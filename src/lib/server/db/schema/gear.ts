// The gear shelf: a studio's flashes, modifiers, reflectors, lenses and cameras. What each kind holds
// is checked by its zod schema in src/lib/scene/gear.ts and kept in `spec`; retired gear stays listed
// for the setups that used it.
import { sql } from 'drizzle-orm';
import { check, index, jsonb, pgTable, text } from 'drizzle-orm/pg-core';
import { belongsTo, optionalRef, timestamps, timestamptz, uuidKey } from './columns';
import type { GearKind } from '$lib/scene/gear';
import { users } from './auth';
import { studios } from './studios';

export const gear = pgTable(
	'gear',
	{
		id: uuidKey(),
		studioId: belongsTo(() => studios.id),
		kind: text().$type<GearKind>().notNull(),
		name: text().notNull(),
		/** Kind-specific figures (guide number, light loss, reflectance…), validated per kind. */
		spec: jsonb().$type<Record<string, unknown>>().notNull(),
		notes: text().notNull().default(''),
		createdById: optionalRef(() => users.id),
		...timestamps(),
		retiredAt: timestamptz()
	},
	(t) => [
		index('gear_studio_kind_name_idx').on(t.studioId, t.kind, t.name),
		check('gear_kind_check', sql`${t.kind} in ('flash', 'modifier', 'reflector', 'lens', 'camera')`)
	]
);

export type Gear = typeof gear.$inferSelect;
export type NewGear = typeof gear.$inferInsert;
