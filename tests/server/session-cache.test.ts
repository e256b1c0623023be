import { describe, expect, it } from 'vitest';
import { createSessionCache } from '../../server/http/session-cache';

const who = { user: { id: 'u1', name: 'Rhea', email: 'r@x.example' }, sessionId: 's1' };
const cookie = 'theme=dark; better-auth.session_token=abc.def';

describe('session cache', () => {
  it('keys by the session token, whatever other cookies come with it', () => {
    const c = createSessionCache();
    c.set(cookie, who, Date.now() + 60_000);
    expect(c.get('better-auth.session_token=abc.def')).toEqual(who);
    expect(c.get('better-auth.session_token=other')).toBeUndefined();
    expect(c.get(undefined)).toBeUndefined();
    expect(c.get('theme=dark')).toBeUndefined();
  });

  it('forgets a session after its time to live, and never keeps it past the session expiry', () => {
    let t = 1_000_000;
    const c = createSessionCache({ ttlMs: 10_000, now: () => t });
    c.set(cookie, who, t + 60_000);
    t += 9_999;
    expect(c.get(cookie)).toEqual(who);
    t += 2;
    expect(c.get(cookie)).toBeUndefined();
    c.set(cookie, who, t + 500); // the session itself ends in half a second
    t += 501;
    expect(c.get(cookie)).toBeUndefined();
  });

  it('forgets a signed-out cookie at once', () => {
    const c = createSessionCache();
    c.set(cookie, who, Date.now() + 60_000);
    c.forget('better-auth.session_token=abc.def');
    expect(c.get(cookie)).toBeUndefined();
  });

  it('does not keep a session looked up while that cookie signed out', () => {
    const c = createSessionCache();
    const ticket = c.ticket(); // a guard starts a lookup
    c.forget('better-auth.session_token=abc.def'); // meanwhile the reader signs out
    c.set(cookie, who, Date.now() + 60_000, ticket); // the lookup's answer arrives
    expect(c.get(cookie)).toBeUndefined();
    c.set(cookie, who, Date.now() + 60_000, c.ticket());
    expect(c.get(cookie)).toEqual(who);
  });

  it('holds at most maxEntries sessions', () => {
    const c = createSessionCache({ maxEntries: 3 });
    for (let i = 0; i < 5; i++) c.set(`better-auth.session_token=t${i}`, who, Date.now() + 60_000);
    expect(c.get('better-auth.session_token=t0')).toBeUndefined();
    expect(c.get('better-auth.session_token=t4')).toEqual(who);
  });
});
