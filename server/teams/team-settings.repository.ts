/** Team-wide rules: read with defaults (every rule off for a team without a row), written by owners. */
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { teamSetting, user } from '../../db/schema';
import type { TeamSettings } from '../../contracts/flown-confirmation';
import { plainText } from '../../contracts/text';

export function createTeamSettingsRepository({ db }: { db: Db }) {
  return {
    async get(teamId: string): Promise<TeamSettings> {
      const [row] = await db
        .select({ requireFlownConfirmation: teamSetting.requireFlownConfirmation, updatedAt: teamSetting.updatedAt, byId: teamSetting.updatedBy, byName: user.name })
        .from(teamSetting)
        .leftJoin(user, eq(user.id, teamSetting.updatedBy))
        .where(eq(teamSetting.teamId, teamId))
        .limit(1);
      if (!row) return { requireFlownConfirmation: false, updatedBy: null, updatedAt: null };
      return {
        requireFlownConfirmation: row.requireFlownConfirmation,
        updatedBy: row.byId ? { id: row.byId, name: plainText(row.byName ?? '(former member)') } : null,
        updatedAt: row.updatedAt.toISOString(),
      };
    },

    async set(teamId: string, userId: string, next: { requireFlownConfirmation: boolean }): Promise<void> {
      await db
        .insert(teamSetting)
        .values({ teamId, requireFlownConfirmation: next.requireFlownConfirmation, updatedBy: userId })
        .onConflictDoUpdate({ target: teamSetting.teamId, set: { requireFlownConfirmation: next.requireFlownConfirmation, updatedBy: userId, updatedAt: sql`now()` } });
    },
  };
}

export type TeamSettingsRepository = ReturnType<typeof createTeamSettingsRepository>;
