import { describe, expect, it } from 'vitest';
import { changingMembers, createMembershipCache, membershipCacheOf } from '../../server/http/membership-cache';

describe('membership cache', () => {
  it('remembers a role, and a non-member, per user and team', () => {
    const c = createMembershipCache();
    c.set(c.ticket(), 'u1', 't1', 'pilot');
    c.set(c.ticket(), 'u2', 't1', null);
    expect(c.get('u1', 't1')).toBe('pilot');
    expect(c.get('u2', 't1')).toBeNull();
    expect(c.get('u1', 't2')).toBeUndefined();
    expect(c.get('u2', 't2')).toBeUndefined();
  });

  it('forgets a role after its time to live', () => {
    let t = 1_000_000;
    const c = createMembershipCache({ ttlMs: 5_000, now: () => t });
    c.set(c.ticket(), 'u1', 't1', 'planner');
    t += 4_999;
    expect(c.get('u1', 't1')).toBe('planner');
    t += 2;
    expect(c.get('u1', 't1')).toBeUndefined();
  });

  it('forgets every role when the member table changes', () => {
    const c = createMembershipCache();
    c.set(c.ticket(), 'u1', 't1', 'owner');
    c.forgetAll();
    expect(c.get('u1', 't1')).toBeUndefined();
  });

  it('does not keep a role read before a change that ended while the read was under way', () => {
    const c = createMembershipCache();
    const ticket = c.ticket(); // the guard starts reading the role
    c.forgetAll(); // meanwhile the member is removed
    c.set(ticket, 'u1', 't1', 'planner'); // the old answer arrives
    expect(c.get('u1', 't1')).toBeUndefined();
    c.set(c.ticket(), 'u1', 't1', null);
    expect(c.get('u1', 't1')).toBeNull();
  });

  it('holds at most maxEntries roles', () => {
    const c = createMembershipCache({ maxEntries: 3 });
    for (let i = 0; i < 5; i++) c.set(c.ticket(), `u${i}`, 't1', 'pilot');
    expect(c.get('u0', 't1')).toBeUndefined();
    expect(c.get('u4', 't1')).toBe('pilot');
  });

  it('keeps one cache per database handle, emptied by changingMembers even when the write fails', async () => {
    const db = {};
    const c = membershipCacheOf(db);
    expect(membershipCacheOf(db)).toBe(c);
    expect(membershipCacheOf({})).not.toBe(c);
    c.set(c.ticket(), 'u1', 't1', 'owner');
    await expect(changingMembers(db, async () => { throw new Error('write refused'); })).rejects.toThrow('write refused');
    expect(c.get('u1', 't1')).toBeUndefined();
    c.set(c.ticket(), 'u1', 't1', 'owner');
    expect(await changingMembers(db, async () => 42)).toBe(42);
    expect(c.get('u1', 't1')).toBeUndefined();
  });
});
