/**
 * The workshop inputs: one zod schema per input, shared by the pages' forms and the services. Every
 * message names what is wrong in plain words; the path names the field.
 */
import { z } from 'zod';
import { WORKSHOP_STATES } from './states';

export const MAX_WORKSHOP_TEXT = 20_000;
export const MAX_CAPTION_CHARS = 2_000;
export const MAX_STEPS_PER_LESSON = 200;
export const MAX_CAPACITY = 10_000;

const title = (what: string) =>
	z
		.string({ error: `Give the ${what} a title.` })
		.trim()
		.min(1, `Give the ${what} a title.`)
		.max(200, `A ${what} title has at most 200 characters.`);

export const markdown = (what: string) =>
	z
		.string({ error: `${what} must be text.` })
		.max(MAX_WORKSHOP_TEXT, `${what} has at most ${MAX_WORKSHOP_TEXT} characters.`)
		.transform((s) => s.replace(/\r\n/g, '\n'));

export const capacitySchema = z.coerce
	.number({ error: 'The capacity must be a whole number of students.' })
	.int('The capacity must be a whole number of students.')
	.min(1, 'The capacity must be at least 1 student.')
	.max(MAX_CAPACITY, `The capacity is at most ${MAX_CAPACITY} students.`);

export const workshopStateSchema = z.enum(WORKSHOP_STATES, { error: 'The state must be draft, published or archived.' });

const uuid = (what: string) => z.uuid({ error: `Choose ${what}.` });

export const workshopCreateSchema = z.object({
	studioId: uuid('a studio'),
	title: title('workshop'),
	summary: markdown('The summary').default(''),
	capacity: capacitySchema.default(12)
});
export type WorkshopCreateInput = z.output<typeof workshopCreateSchema>;

export const workshopDetailsSchema = z.object({
	title: title('workshop'),
	summary: markdown('The summary'),
	capacity: capacitySchema,
	state: workshopStateSchema
});
export type WorkshopDetailsInput = z.output<typeof workshopDetailsSchema>;

/** A moment: an ISO date-time with its offset (`2026-12-10T19:00:00Z`), as the API and the browser send it. */
export const moment = (field: string) =>
	z
		.string({ error: `Give the ${field}.` })
		.trim()
		.min(1, `Give the ${field}.`)
		.pipe(z.iso.datetime({ offset: true, error: `The ${field} is not a date and time (e.g. 2026-12-10T19:00:00Z).` }))
		.transform((s) => new Date(s))
		.refine((d) => !Number.isNaN(d.getTime()) && d.getUTCFullYear() >= 2000 && d.getUTCFullYear() <= 2200, {
			error: `The ${field} must be a real date between the years 2000 and 2200.`
		});

export const sessionSchema = z
	.object({
		startsAt: moment('start'),
		endsAt: moment('end'),
		place: z.string({ error: 'Say where it takes place.' }).trim().min(1, 'Say where it takes place.').max(200, 'A place has at most 200 characters.')
	})
	.superRefine((s, ctx) => {
		// Runs even when a field failed its own check: compare only two real moments.
		if (!(s.startsAt instanceof Date) || !(s.endsAt instanceof Date)) return;
		if (s.endsAt.getTime() <= s.startsAt.getTime()) {
			ctx.addIssue({ code: 'custom', path: ['endsAt'], message: 'The end must come after the start.' });
		} else if (s.endsAt.getTime() - s.startsAt.getTime() > 7 * 24 * 3600_000) {
			ctx.addIssue({ code: 'custom', path: ['endsAt'], message: 'A session lasts at most 7 days; add another session instead.' });
		}
	});
export type SessionInput = z.output<typeof sessionSchema>;

export const lessonSchema = z.object({
	title: title('lesson'),
	studentNotes: markdown('The notes for students').default(''),
	presenterNotes: markdown('The notes for the presenter').default('')
});
export type LessonInput = z.output<typeof lessonSchema>;

const elementIds = z
	.array(z.string().min(1).max(100), { error: 'Hidden elements must be a list of element ids.' })
	.max(500, 'At most 500 elements can be hidden.');

export const revisionNumber = z.coerce
	.number({ error: 'The revision must be a whole number.' })
	.int('The revision must be a whole number.')
	.min(1, 'Revisions are numbered from 1.');

export const stepCreateSchema = z.object({
	setupId: z.uuid({ error: 'Choose a setup.' }),
	/** Omitted: the setup's latest revision at the moment the step is made. */
	revisionNumber: revisionNumber.optional(),
	hiddenElementIds: elementIds.default([]),
	caption: z.string().max(MAX_CAPTION_CHARS, `A caption has at most ${MAX_CAPTION_CHARS} characters.`).default('')
});
export type StepCreateInput = z.output<typeof stepCreateSchema>;

export const stepUpdateSchema = z.object({
	revisionNumber: revisionNumber.optional(),
	hiddenElementIds: elementIds.optional(),
	caption: z.string().max(MAX_CAPTION_CHARS, `A caption has at most ${MAX_CAPTION_CHARS} characters.`).optional()
});
export type StepUpdateInput = z.output<typeof stepUpdateSchema>;

export const stepOrderSchema = z.object({
	stepIds: z
		.array(z.uuid({ error: 'Each step must be named by its id.' }), { error: 'Give the steps in their new order.' })
		.min(1, 'Give the steps in their new order.')
		.max(MAX_STEPS_PER_LESSON, `A lesson has at most ${MAX_STEPS_PER_LESSON} steps.`)
});

export const lessonOrderSchema = z.object({
	lessonIds: z.array(z.uuid({ error: 'Each lesson must be named by its id.' })).min(1, 'Give the lessons in their new order.').max(200)
});

export const copyStepSchema = z.object({
	studioId: z.uuid({ error: 'Choose a studio of yours.' }).optional(),
	subject: z.string().trim().min(1, 'Name the subject you will try it on.').max(200, 'A subject has at most 200 characters.'),
	title: z.string().trim().min(1).max(200, 'A title has at most 200 characters.').optional()
});
export type CopyStepInput = z.output<typeof copyStepSchema>;

export const joinRequestSchema = z.object({
	message: z.string().trim().max(1000, 'A message has at most 1000 characters.').default('')
});
