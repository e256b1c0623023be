/** The invented demo team: one user per role. All names are fictional; the addresses use the reserved .example domain. */
import type { Role } from './roles';

export const demoTeam = { name: 'Brackenmoor Aerial Mapping', slug: 'brackenmoor-aerial-mapping' } as const;

export const demoUsers: ReadonlyArray<{ role: Role; name: string; email: string }> = [
  { role: 'owner', name: 'Ada Pennick', email: 'ada.pennick@brackenmoor.example' },
  { role: 'planner', name: 'Tomas Vell', email: 'tomas.vell@brackenmoor.example' },
  { role: 'surveyor', name: 'Rhea Castellan', email: 'rhea.castellan@brackenmoor.example' },
  { role: 'pilot', name: 'Jory Marsh', email: 'jory.marsh@brackenmoor.example' },
];
