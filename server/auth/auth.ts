/** better-auth: e-mail + password accounts, cookie sessions, rate-limited sign-in, teams as organizations. */
import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';
import type { Db } from '../../db/client';
import { schema } from '../../db/client';
import type { Config } from '../config';
import { trustedOriginsOf } from '../http/origin';
import { ac, acRoles } from './access';

interface AuthHooks {
  /** Called when someone tries to sign up with an address that already has an account (no hint is given to them). */
  onExistingSignUp?: (user: { email: string; name: string }) => Promise<void>;
}

/** Build the auth instance for one server. */
export function createAuth(deps: { db: Db; config: Config; hooks?: AuthHooks }) {
  const { db, config, hooks } = deps;
  return betterAuth({
    appName: 'Loftline',
    baseURL: config.publicUrl,
    basePath: '/api/auth',
    secret: config.authSecret,
    database: drizzleAdapter(db, { provider: 'pg', schema }),
    telemetry: { enabled: false },
    // Failed sign-ins are expected in tests; keep their logs to real errors.
    logger: { level: config.env.NODE_ENV === 'test' ? 'error' : 'warn' },
    trustedOrigins: trustedOriginsOf(config.publicUrl),
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      // Sign-up never signs in: with this the answer for a taken address looks like any other sign-up,
      // so the form gives no hint whether an e-mail is registered.
      autoSignIn: false,
      onExistingUserSignUp: hooks?.onExistingSignUp
        ? async ({ user }) => hooks.onExistingSignUp!({ email: user.email, name: user.name })
        : undefined,
    },
    session: { expiresIn: 60 * 60 * 24 * 14, updateAge: 60 * 60 * 24 },
    rateLimit: {
      enabled: true,
      // One counter store per server instance (the built-in memory store is shared by the whole process).
      customStorage: memoryRateLimitStore(),
      window: 60,
      max: 300,
      customRules: {
        '/sign-in/email': { window: 60, max: config.signInPerMinute },
        '/sign-up/email': { window: 60, max: Math.max(config.signInPerMinute, 10) },
      },
    },
    advanced: { ipAddress: { ipAddressHeaders: ['x-forwarded-for'] } },
    plugins: [
      organization({
        ac,
        roles: acRoles,
        creatorRole: 'owner',
        allowUserToCreateOrganization: true,
        invitationExpiresIn: 60 * 60 * 24 * 7,
      }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;

/** In-memory fixed-window rate-limit counters for one auth instance (check and increment in one step). */
function memoryRateLimitStore() {
  const windows = new Map<string, { startMs: number; count: number }>();
  return {
    consume: async (key: string, rule: { window: number; max: number }) => {
      const now = Date.now();
      const w = windows.get(key);
      if (!w || now - w.startMs >= rule.window * 1000) {
        windows.set(key, { startMs: now, count: 1 });
        return { allowed: true, retryAfter: null };
      }
      if (w.count >= rule.max) return { allowed: false, retryAfter: Math.ceil((w.startMs + rule.window * 1000 - now) / 1000) };
      w.count++;
      return { allowed: true, retryAfter: null };
    },
  };
}
