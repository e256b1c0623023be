/** Route guards: every API route starts with one, and each guard records what it requires so tests can walk them. */
import { fromNodeHeaders } from 'better-auth/node';
import { and, eq, sql } from 'drizzle-orm';
import type { Request, RequestHandler } from 'express';
import { can, roleSchema, type Permission, type Role } from '../../contracts/roles';
import type { Db } from '../../db/client';
import { member } from '../../db/schema';
import type { Auth } from '../auth/auth';
import { AppError, errors } from './errors';
import { createSessionCache, sessionTokenOf, type SessionCache } from './session-cache';
import { membershipCacheOf, type MembershipCache } from './membership-cache';
import type { RequestAuth } from './request-auth';

export type { SessionUser } from './request-auth';

/** What a guard demands: only a session, or a permission within the team named by `:teamId`. */
export type GuardMeta = { kind: 'public' } | { kind: 'session' } | { kind: 'permission'; permission: Permission };

const guardMetaKey = Symbol.for('loftline.guard');

declare module 'express-serve-static-core' {
  interface Request {
    auth?: RequestAuth;
  }
}

function tag(handler: RequestHandler, meta: GuardMeta): RequestHandler {
  (handler as unknown as Record<symbol, GuardMeta>)[guardMetaKey] = meta;
  return handler;
}

/** The guard metadata of a handler, if it is a guard. */
export function guardMetaOf(handler: unknown): GuardMeta | undefined {
  return (handler as Record<symbol, GuardMeta> | undefined)?.[guardMetaKey];
}

/** Signed-in user, with the caller's session read from the cookie. */
export function requireAuth(req: Request): RequestAuth {
  if (!req.auth) throw errors.unauthenticated();
  return req.auth;
}

/** Team id and role set by a permission guard. */
export function requireTeam(req: Request): RequestAuth & { teamId: string; role: Role } {
  const a = requireAuth(req);
  if (!a.teamId || !a.role) throw new Error('requireTeam used on a route without a permission guard');
  return a as RequestAuth & { teamId: string; role: Role };
}

/** Factory for the guards of one server. */
export function createGuards(deps: { auth: Auth; db: Db; sessions?: SessionCache; memberships?: MembershipCache }) {
  const { auth, db } = deps;

  const sessions = deps.sessions ?? createSessionCache();
  const memberships = deps.memberships ?? membershipCacheOf(db);
  // Prepared once: the database plans it once per connection instead of on every guarded request.
  const roleQuery = db
    .select({ role: member.role })
    .from(member)
    .where(and(eq(member.organizationId, sql.placeholder('teamId')), eq(member.userId, sql.placeholder('userId'))))
    .limit(1)
    .prepare('guard_member_role');

  /** The caller's role in the team (null: not a member), from the membership cache or the database. */
  async function roleIn(userId: string, teamId: string): Promise<Role | null> {
    const known = memberships.get(userId, teamId);
    if (known !== undefined) return known;
    const ticket = memberships.ticket();
    const rows = await roleQuery.execute({ teamId, userId });
    const parsed = roleSchema.safeParse(rows[0]?.role);
    const role = parsed.success ? parsed.data : null;
    memberships.set(ticket, userId, teamId, role);
    return role;
  }

  /**
   * Lookups under way per session token: when a cached session runs out, the many requests of that reader that
   * arrive meanwhile wait for one lookup instead of each verifying the cookie and reading the database.
   */
  const lookups = new Map<string, Promise<RequestAuth | null>>();

  async function lookUp(req: Request): Promise<RequestAuth | null> {
    const cookie = req.headers.cookie;
    const ticket = sessions.ticket();
    const s = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
    if (!s) return null;
    const found = { user: { id: s.user.id, name: s.user.name, email: s.user.email }, sessionId: s.session.id };
    sessions.set(cookie, found, new Date(s.session.expiresAt).getTime(), ticket);
    return found;
  }

  async function loadSession(req: Request): Promise<RequestAuth> {
    const cookie = req.headers.cookie;
    const cached = sessions.get(cookie);
    if (cached) return cached;
    // Shared only between requests with the very same Cookie header (the token and its signature are both in it),
    // and never across a sign-out: the key holds the cache's generation, which every sign-out moves on.
    const token = sessionTokenOf(cookie) ? `${sessions.ticket()}\u0000${cookie}` : undefined;
    let pending = token === undefined ? undefined : lookups.get(token);
    if (!pending) {
      pending = lookUp(req);
      if (token !== undefined) {
        lookups.set(token, pending);
        void pending.finally(() => lookups.delete(token)).catch(() => undefined);
      }
    }
    const found = await pending;
    if (!found) throw errors.unauthenticated();
    return found;
  }

  return {
    /** The per-process session cache (sign-out empties it for the signed-out cookie). */
    sessions,
    /** Roles per (user, team), emptied by every write to the member table. */
    memberships,

    /** The signed-in caller of `req`, or null (no cookie, or a session that has ended); never throws for that. */
    sessionOf: async (req: Request): Promise<RequestAuth | null> => {
      if (!sessionTokenOf(req.headers.cookie)) return null;
      return loadSession(req).catch((e: unknown) => {
        if (e instanceof AppError && e.status === 401) return null;
        throw e;
      });
    },
    /** The caller's role in a team, or null when not a member (cached like the permission guard's). */
    roleIn,

    /** Open to anyone (health check). */
    public: (): RequestHandler => tag((_req, _res, next) => next(), { kind: 'public' }),

    /** Any signed-in user. */
    session: (): RequestHandler =>
      tag(async (req, _res, next) => {
        req.auth = await loadSession(req);
        next();
      }, { kind: 'session' }),

    /** A member of `:teamId` whose role holds `permission`. Non-members get 404 so team ids reveal nothing. */
    permission: (permission: Permission): RequestHandler =>
      tag(async (req, _res, next) => {
        const a = await loadSession(req);
        const teamId = String(req.params.teamId ?? '');
        if (!teamId) throw new Error(`permission guard '${permission}' on a route without :teamId`);
        const role = await roleIn(a.user.id, teamId);
        if (!role) throw errors.not_found('Team');
        if (!can(role, permission)) throw errors.forbidden(describe(permission));
        req.auth = { ...a, teamId, role };
        next();
      }, { kind: 'permission', permission }),
  };
}

export type Guards = ReturnType<typeof createGuards>;

const descriptions: Partial<Record<Permission, string>> = {
  'member:read': 'see the team members',
  'member:manage': 'change roles or remove members',
  'invitation:manage': 'invite people',
  'project:write': 'create or edit projects',
  'site:write': 'upload or edit elevation grids',
  'plan:write': 'edit plans',
  'plan:run': 'run analyses',
  'plan:submit': 'send plans for review',
  'plan:review': 'sign plans off or return them',
  'outbox:read': 'read the outbox',
};

function describe(p: Permission): string {
  return descriptions[p] ?? `do this (${p})`;
}
