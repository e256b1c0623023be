/** Shapes for the signed-in user, teams and members. */
import { z } from 'zod';
import { userText } from './text';
import { roleSchema } from './roles';

export const healthSchema = z.object({ ok: z.literal(true), db: z.literal('up') });

export const teamSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  slug: z.string(),
  role: roleSchema,
});
export type TeamSummary = z.infer<typeof teamSummarySchema>;

export const meSchema = z.object({
  user: z.object({ id: z.string(), name: z.string(), email: z.string() }),
  teams: z.array(teamSummarySchema),
});
export type Me = z.infer<typeof meSchema>;

export const createTeamSchema = z.object({
  name: userText().trim().min(2, 'A team name needs at least 2 characters.').max(80, 'Keep the team name under 80 characters.'),
});
export type CreateTeam = z.infer<typeof createTeamSchema>;

export const memberSchema = z.object({
  id: z.string(),
  userId: z.string(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  joinedAt: z.string(),
});
export type Member = z.infer<typeof memberSchema>;

export const membersSchema = z.object({ members: z.array(memberSchema) });

export const updateMemberRoleSchema = z.object({ role: roleSchema });
