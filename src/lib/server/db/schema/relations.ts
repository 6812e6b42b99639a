import { relations } from 'drizzle-orm';
import { accessTokens } from './security';
import { sessions, users } from './auth';
import { invitations, memberships, studios } from './studios';
import { setupRevisions, setups } from './setups';
import { gear } from './gear';
import { flashCalibrations, sessionTicks, shootingSessions, shotMeasures, shots } from './shots';
import {
	workshopInvitations,
	workshopJoinRequests,
	workshopLessons,
	workshopMembers,
	workshopSessions,
	workshopSteps,
	workshops
} from './workshops';
import { exerciseStarts, exercises, handIns } from './exercises';

export const usersRelations = relations(users, ({ many }) => ({
	memberships: many(memberships),
	sessions: many(sessions),
	accessTokens: many(accessTokens)
}));

export const studiosRelations = relations(studios, ({ many }) => ({
	memberships: many(memberships),
	invitations: many(invitations)
}));

export const membershipsRelations = relations(memberships, ({ one }) => ({
	studio: one(studios, { fields: [memberships.studioId], references: [studios.id] }),
	user: one(users, { fields: [memberships.userId], references: [users.id] })
}));

export const invitationsRelations = relations(invitations, ({ one }) => ({
	studio: one(studios, { fields: [invitations.studioId], references: [studios.id] }),
	invitedBy: one(users, { fields: [invitations.invitedById], references: [users.id] })
}));

export const sessionsRelations = relations(sessions, ({ one }) => ({
	user: one(users, { fields: [sessions.userId], references: [users.id] })
}));

export const accessTokensRelations = relations(accessTokens, ({ one }) => ({
	user: one(users, { fields: [accessTokens.userId], references: [users.id] })
}));

export const setupsRelations = relations(setups, ({ one, many }) => ({
	studio: one(studios, { fields: [setups.studioId], references: [studios.id] }),
	revisions: many(setupRevisions),
	derivedFrom: one(setups, {
		fields: [setups.derivedFromSetupId],
		references: [setups.id],
		relationName: 'lineage'
	}),
	derivatives: many(setups, { relationName: 'lineage' }),
	createdBy: one(users, { fields: [setups.createdById], references: [users.id] })
}));

export const setupRevisionsRelations = relations(setupRevisions, ({ one }) => ({
	setup: one(setups, { fields: [setupRevisions.setupId], references: [setups.id] }),
	author: one(users, { fields: [setupRevisions.authorId], references: [users.id] })
}));

export const gearRelations = relations(gear, ({ one }) => ({
	studio: one(studios, { fields: [gear.studioId], references: [studios.id] }),
	createdBy: one(users, { fields: [gear.createdById], references: [users.id] })
}));

export const shootingSessionsRelations = relations(shootingSessions, ({ one, many }) => ({
	setup: one(setups, { fields: [shootingSessions.setupId], references: [setups.id] }),
	shots: many(shots),
	ticks: many(sessionTicks)
}));

export const shotsRelations = relations(shots, ({ one, many }) => ({
	setup: one(setups, { fields: [shots.setupId], references: [setups.id] }),
	session: one(shootingSessions, { fields: [shots.sessionId], references: [shootingSessions.id] }),
	measures: many(shotMeasures)
}));

export const shotMeasuresRelations = relations(shotMeasures, ({ one }) => ({
	shot: one(shots, { fields: [shotMeasures.shotId], references: [shots.id] })
}));

export const flashCalibrationsRelations = relations(flashCalibrations, ({ one }) => ({
	gear: one(gear, { fields: [flashCalibrations.gearId], references: [gear.id] }),
	shot: one(shots, { fields: [flashCalibrations.shotId], references: [shots.id] })
}));

export const sessionTicksRelations = relations(sessionTicks, ({ one }) => ({
	session: one(shootingSessions, { fields: [sessionTicks.sessionId], references: [shootingSessions.id] })
}));

export const workshopsRelations = relations(workshops, ({ one, many }) => ({
	studio: one(studios, { fields: [workshops.studioId], references: [studios.id] }),
	sessions: many(workshopSessions),
	lessons: many(workshopLessons),
	members: many(workshopMembers),
	invitations: many(workshopInvitations)
}));

export const workshopSessionsRelations = relations(workshopSessions, ({ one }) => ({
	workshop: one(workshops, { fields: [workshopSessions.workshopId], references: [workshops.id] })
}));

export const workshopLessonsRelations = relations(workshopLessons, ({ one, many }) => ({
	workshop: one(workshops, { fields: [workshopLessons.workshopId], references: [workshops.id] }),
	steps: many(workshopSteps)
}));

export const workshopStepsRelations = relations(workshopSteps, ({ one }) => ({
	lesson: one(workshopLessons, { fields: [workshopSteps.lessonId], references: [workshopLessons.id] }),
	setup: one(setups, { fields: [workshopSteps.setupId], references: [setups.id] })
}));

export const workshopMembersRelations = relations(workshopMembers, ({ one }) => ({
	workshop: one(workshops, { fields: [workshopMembers.workshopId], references: [workshops.id] }),
	user: one(users, { fields: [workshopMembers.userId], references: [users.id] })
}));

export const workshopInvitationsRelations = relations(workshopInvitations, ({ one }) => ({
	workshop: one(workshops, { fields: [workshopInvitations.workshopId], references: [workshops.id] })
}));

export const workshopJoinRequestsRelations = relations(workshopJoinRequests, ({ one }) => ({
	workshop: one(workshops, { fields: [workshopJoinRequests.workshopId], references: [workshops.id] }),
	user: one(users, { fields: [workshopJoinRequests.userId], references: [users.id] })
}));

export const exercisesRelations = relations(exercises, ({ one, many }) => ({
	workshop: one(workshops, { fields: [exercises.workshopId], references: [workshops.id] }),
	lesson: one(workshopLessons, { fields: [exercises.lessonId], references: [workshopLessons.id] }),
	setup: one(setups, { fields: [exercises.setupId], references: [setups.id] }),
	starts: many(exerciseStarts),
	handIns: many(handIns)
}));

export const exerciseStartsRelations = relations(exerciseStarts, ({ one }) => ({
	exercise: one(exercises, { fields: [exerciseStarts.exerciseId], references: [exercises.id] }),
	user: one(users, { fields: [exerciseStarts.userId], references: [users.id] }),
	setup: one(setups, { fields: [exerciseStarts.setupId], references: [setups.id] })
}));

export const handInsRelations = relations(handIns, ({ one }) => ({
	exercise: one(exercises, { fields: [handIns.exerciseId], references: [exercises.id] }),
	user: one(users, { fields: [handIns.userId], references: [users.id] })
}));
