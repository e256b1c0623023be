/**
 * Team roles looked up in the last few seconds, keyed by (user, team). Every team route's guard used to ask the
 * database for the caller's role; under load that round trip (and the database's work for it) was half of the
 * queries of a cached read. The guard still checks the role on every request; only the lookup is reused.
 *
 * Staleness: every write to the member table in this process (team created, role changed, member removed,
 * invitation accepted) empties the cache when its transaction ends, so the very next request reads the new role.
 * A lookup that started before such a write is not stored when it finishes after it (a generation counter), so
 * an old role cannot slip back in. Writes made by another process on the same database (a second API server,
 * an SQL console) reach this cache after at most `ttlMs`. Non-members are remembered too (their 404), bounded in
 * number like members.
 */
import type { Role } from '../../contracts/roles';

export interface MembershipCache {
  /** The remembered role of `userId` in `teamId` (null: not a member), or undefined when not known. */
  get(userId: string, teamId: string): Role | null | undefined;
  /** Call before reading the role from the database; pass the answer to `set` with it. */
  ticket(): number;
  /** Remember a role read from the database, unless the member table changed since `ticket` was taken. */
  set(ticket: number, userId: string, teamId: string, role: Role | null): void;
  /** Forget every role (after any write to the member table). */
  forgetAll(): void;
}

export function createMembershipCache(opts: { ttlMs?: number; maxEntries?: number; now?: () => number } = {}): MembershipCache {
  const ttlMs = opts.ttlMs ?? 5_000;
  const maxEntries = opts.maxEntries ?? 10_000;
  const now = opts.now ?? Date.now;
  const entries = new Map<string, { role: Role | null; untilMs: number }>();
  let generation = 0;
  const keyOf = (userId: string, teamId: string) => `${userId}\u0000${teamId}`;
  return {
    get(userId, teamId) {
      const key = keyOf(userId, teamId);
      const e = entries.get(key);
      if (!e) return undefined;
      if (e.untilMs <= now()) {
        entries.delete(key);
        return undefined;
      }
      return e.role;
    },
    ticket: () => generation,
    set(ticket, userId, teamId, role) {
      if (ticket !== generation) return;
      if (entries.size >= maxEntries) entries.delete(entries.keys().next().value!);
      entries.set(keyOf(userId, teamId), { role, untilMs: now() + ttlMs });
    },
    forgetAll() {
      generation++;
      entries.clear();
    },
  };
}

const perDatabase = new WeakMap<object, MembershipCache>();

/**
 * The one membership cache of a database handle: the guards read it, the repositories that write members empty
 * it, and each has only the handle in common.
 */
export function membershipCacheOf(db: object): MembershipCache {
  let c = perDatabase.get(db);
  if (!c) {
    c = createMembershipCache();
    perDatabase.set(db, c);
  }
  return c;
}

/** Run a write that may change memberships, and empty the cache when it ends (committed or not). */
export async function changingMembers<T>(db: object, write: () => Promise<T>): Promise<T> {
  try {
    return await write();
  } finally {
    membershipCacheOf(db).forgetAll();
  }
}
