import { describe, expect, it } from 'vitest';
import type { TeamSummary } from '../../../contracts/teams';
import { pickCurrentTeam } from '../../../components/team/current-team';
import { readRememberedTeam, rememberTeam, teamStorageKey } from '../../../components/team/team-storage';

const teams: TeamSummary[] = [
  { id: 't1', name: 'Brackenmoor Aerial Mapping', slug: 'brackenmoor-aerial-mapping', role: 'pilot' },
  { id: 't2', name: 'Quarry Hill Survey Crew', slug: 'quarry-hill-survey-crew', role: 'owner' },
];

describe('pickCurrentTeam', () => {
  it('takes the first team when nothing is remembered', () => {
    expect(pickCurrentTeam(teams, null)?.id).toBe('t1');
  });

  it('keeps the remembered team while the user still belongs to it', () => {
    expect(pickCurrentTeam(teams, 't2')?.id).toBe('t2');
  });

  it('falls back to the first team when the remembered one is gone (removed from it, or another user)', () => {
    expect(pickCurrentTeam(teams, 'gone')?.id).toBe('t1');
  });

  it('gives null to a user with no team', () => {
    expect(pickCurrentTeam([], 't1')).toBeNull();
  });

  it('does not mutate the team list', () => {
    const copy = structuredClone(teams);
    pickCurrentTeam(teams, 't2');
    expect(teams).toEqual(copy);
  });
});

function memoryStore() {
  const data = new Map<string, string>();
  return {
    data,
    getItem: (k: string) => data.get(k) ?? null,
    setItem: (k: string, v: string) => void data.set(k, v),
    removeItem: (k: string) => void data.delete(k),
  };
}

describe('team storage', () => {
  it('remembers the team id under the key "loftline.team"', () => {
    const store = memoryStore();
    rememberTeam('t2', store);
    expect(teamStorageKey).toBe('loftline.team');
    expect(store.data.get('loftline.team')).toBe('t2');
    expect(readRememberedTeam(store)).toBe('t2');
  });

  it('forgets the team when given null', () => {
    const store = memoryStore();
    rememberTeam('t2', store);
    rememberTeam(null, store);
    expect(readRememberedTeam(store)).toBeNull();
  });

  it('reads null and writes nothing when there is no storage at all', () => {
    expect(readRememberedTeam(null)).toBeNull();
    expect(() => rememberTeam('t1', null)).not.toThrow();
  });

  it('survives a storage that throws (privacy mode, full quota)', () => {
    const broken = {
      getItem: () => {
        throw new Error('SecurityError');
      },
      setItem: () => {
        throw new Error('QuotaExceededError');
      },
      removeItem: () => {
        throw new Error('SecurityError');
      },
    };
    expect(readRememberedTeam(broken)).toBeNull();
    expect(() => rememberTeam('t1', broken)).not.toThrow();
  });
});
