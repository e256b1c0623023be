/** Which of the user's teams is current: the remembered one while the user still belongs to it, else the first. */
import type { TeamSummary } from '../../contracts/teams';

/** The current team given the user's teams (server order) and the id remembered on this device, or null with no team. */
export function pickCurrentTeam(teams: readonly TeamSummary[], rememberedId: string | null | undefined): TeamSummary | null {
  if (teams.length === 0) return null;
  if (rememberedId) {
    const remembered = teams.find((t) => t.id === rememberedId);
    if (remembered) return remembered;
  }
  return teams[0]!;
}
