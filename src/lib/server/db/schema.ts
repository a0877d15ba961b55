import { pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();
const updatedAt = () =>
	timestamp('updated_at', { withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date());

/** The team space: a shop or a single builder's garage. */
export const workshop = pgTable('workshop', {
	id: uuid('id').primaryKey().defaultRandom(),
	slug: text('slug').notNull().unique(),
	name: text('name').notNull(),
	createdAt: createdAt()
});

/** One engine project inside a workshop. */
export const build = pgTable(
	'build',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		workshopId: uuid('workshop_id')
			.notNull()
			.references(() => workshop.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		engine: text('engine').notNull().default(''),
		notes: text('notes').notNull().default(''),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [unique('build_workshop_name').on(t.workshopId, t.name)]
);
