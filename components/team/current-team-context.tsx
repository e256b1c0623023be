/** The current team and the user's role in it, shared by the navigation and every screen of the signed-in area. */
import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';
import type { Role } from '../../contracts/roles';
import type { Me, TeamSummary } from '../../contracts/teams';
import { pickCurrentTeam } from './current-team';
import { readRememberedTeam, rememberTeam } from './team-storage';

type CurrentTeamValue = {
  me: Me;
  team: TeamSummary | null;
  role: Role | null;
  /** Makes `teamId` current and remembers it on this device. */
  selectTeam: (teamId: string) => void;
};

const CurrentTeamContext = createContext<CurrentTeamValue | null>(null);

/** Provides the current team for a signed-in user (`me` from GET /api/me). */
export function CurrentTeamProvider({ me, children }: { me: Me; children: ReactNode }) {
  const [rememberedId, setRememberedId] = useState<string | null>(() => readRememberedTeam());
  const selectTeam = useCallback((teamId: string) => {
    rememberTeam(teamId);
    setRememberedId(teamId);
  }, []);
  const value = useMemo<CurrentTeamValue>(() => {
    const team = pickCurrentTeam(me.teams, rememberedId);
    return { me, team, role: team?.role ?? null, selectTeam };
  }, [me, rememberedId, selectTeam]);
  return <CurrentTeamContext.Provider value={value}>{children}</CurrentTeamContext.Provider>;
}

/** The current team; throws outside the signed-in area, where there is none. */
export function useCurrentTeam(): CurrentTeamValue {
  const value = useContext(CurrentTeamContext);
  if (!value) throw new Error('useCurrentTeam: used outside CurrentTeamProvider (only the signed-in area has a team).');
  return value;
}
