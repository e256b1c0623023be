/** Options of `npm run link -- …`, parsed with one message per mistake. */
export type Connection = { kind: 'udp' | 'tcp'; host: string; port: number } | { kind: 'serial'; path: string; baud: number };

export interface LinkOptions {
  server: string;
  email: string;
  password: string;
  versionId: string;
  connection: Connection;
  /** Wait for one answer of the mission protocol before a retry (MAVLink's default is 1500 ms). */
  timeoutMs: number;
  /** Retries of one step before giving up. */
  retries: number;
  /** After READY, stay and forward every photo the aircraft reports to Loftline until it has returned to launch. */
  follow: boolean;
  /** The autopilot keeps its home position as item 0 (ArduPilot's convention): send a placeholder there. */
  homeItem: boolean;
}

export const usage = `usage: npm run link -- --server URL --email E --password P --version ID (--udp HOST:PORT | --tcp HOST:PORT | --serial PATH [--baud N]) [--timeout-ms 1500] [--retries 5] [--follow] [--home-item]
  The password may come from LOFTLINE_PASSWORD instead of --password.`;

/** An option error, printed with the usage. */
export class UsageError extends Error {}

function hostPort(flag: string, v: string): { host: string; port: number } {
  const m = /^(.+):(\d{1,5})$/.exec(v);
  const port = m ? Number(m[2]) : NaN;
  if (!m || port < 1 || port > 65535) throw new UsageError(`${flag} needs HOST:PORT (e.g. 127.0.0.1:14550), got "${v}".`);
  return { host: m[1].replace(/^\[|\]$/g, ''), port };
}

/** Parse argv (after `--`); `env` supplies LOFTLINE_PASSWORD. */
export function parseLinkArgs(argv: string[], env: Record<string, string | undefined> = {}): LinkOptions {
  const values = new Map<string, string>();
  let follow = false;
  let homeItem = false;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--follow' || a === '--home-item') {
      if (a === '--follow') follow = true;
      else homeItem = true;
      continue;
    }
    if (!a.startsWith('--')) throw new UsageError(`Unexpected argument "${a}".`);
    const eq = a.indexOf('=');
    const key = eq > 0 ? a.slice(2, eq) : a.slice(2);
    const value = eq > 0 ? a.slice(eq + 1) : argv[++i];
    if (value === undefined) throw new UsageError(`--${key} needs a value.`);
    if (values.has(key)) throw new UsageError(`--${key} is given twice.`);
    values.set(key, value);
  }
  const known = new Set(['server', 'email', 'password', 'version', 'udp', 'tcp', 'serial', 'baud', 'timeout-ms', 'retries']);
  for (const k of values.keys()) if (!known.has(k)) throw new UsageError(`Unknown option --${k}.`);
  const need = (k: string) => {
    const v = values.get(k);
    if (!v) throw new UsageError(`--${k} is required.`);
    return v;
  };
  const server = need('server').replace(/\/+$/, '');
  if (!/^https?:\/\/[^/]+/.test(server)) throw new UsageError(`--server needs an http(s) address such as http://127.0.0.1:8080, got "${server}".`);
  const password = values.get('password') ?? env.LOFTLINE_PASSWORD;
  if (!password) throw new UsageError('--password (or LOFTLINE_PASSWORD) is required.');
  const ways = ['udp', 'tcp', 'serial'].filter((k) => values.has(k));
  if (ways.length !== 1) throw new UsageError(`Give exactly one of --udp, --tcp or --serial (got ${ways.length ? ways.map((w) => `--${w}`).join(', ') : 'none'}).`);
  let connection: Connection;
  if (ways[0] === 'serial') {
    const baud = Number(values.get('baud') ?? 57600);
    if (!Number.isInteger(baud) || baud < 1200 || baud > 4_000_000) throw new UsageError(`--baud needs a whole number of bits per second (e.g. 57600), got "${values.get('baud')}".`);
    connection = { kind: 'serial', path: need('serial'), baud };
  } else {
    if (values.has('baud')) throw new UsageError('--baud goes with --serial only.');
    connection = { kind: ways[0] as 'udp' | 'tcp', ...hostPort(`--${ways[0]}`, need(ways[0])) };
  }
  const int = (k: string, d: number, min: number, max: number) => {
    const v = Number(values.get(k) ?? d);
    if (!Number.isInteger(v) || v < min || v > max) throw new UsageError(`--${k} needs a whole number from ${min} to ${max}, got "${values.get(k)}".`);
    return v;
  };
  return { server, email: need('email'), password, versionId: need('version'), connection, timeoutMs: int('timeout-ms', 1500, 50, 60_000), retries: int('retries', 5, 0, 50), follow, homeItem };
}
