/** A cookie-keeping JSON client for API tests over real HTTP. */
interface JsonResponse<T = any> {
  status: number;
  body: T;
  headers: Headers;
}

export class ApiClient {
  private cookies = new Map<string, string>();
  constructor(readonly baseUrl: string) {}

  /** The Cookie header this client sends (for raw requests in tests). */
  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keepCookies(res: Response): void {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      if (value === '' || /max-age=0/i.test(c)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  /**
   * Send a request; `body` objects are sent as JSON, strings/buffers as they are. Like a browser on Loftline's own
   * pages it sends `Origin: <server>` (the server refuses state-changing requests from other sites); `noOrigin` leaves
   * it out.
   */
  async request<T = any>(
    method: string,
    path: string,
    opts: { body?: unknown; headers?: Record<string, string>; noOrigin?: boolean } = {},
  ): Promise<JsonResponse<T>> {
    const headers: Record<string, string> = { ...(opts.noOrigin ? {} : { Origin: this.baseUrl }), ...opts.headers };
    if (this.cookies.size) headers.Cookie = this.cookieHeader();
    let body: BodyInit | undefined;
    if (opts.body instanceof FormData || typeof opts.body === 'string' || opts.body instanceof Uint8Array) {
      body = opts.body as BodyInit;
    } else if (opts.body !== undefined) {
      body = JSON.stringify(opts.body);
      headers['Content-Type'] ??= 'application/json';
    }
    const res = await fetch(this.baseUrl + path, { method, headers, body, redirect: 'manual' });
    this.keepCookies(res);
    const text = await res.text();
    let parsed: unknown = text;
    if ((res.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text);
    return { status: res.status, body: parsed as T, headers: res.headers };
  }

  /** GET a binary body (PDFs, grids) as bytes. */
  async getBytes(path: string): Promise<{ status: number; bytes: Buffer; headers: Headers }> {
    const headers: Record<string, string> = { Origin: this.baseUrl };
    if (this.cookies.size) headers.Cookie = this.cookieHeader();
    const res = await fetch(this.baseUrl + path, { headers, redirect: 'manual' });
    return { status: res.status, bytes: Buffer.from(await res.arrayBuffer()), headers: res.headers };
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path);
  }
  post<T = any>(path: string, body?: unknown) {
    return this.request<T>('POST', path, { body: body ?? {} });
  }
  patch<T = any>(path: string, body?: unknown) {
    return this.request<T>('PATCH', path, { body: body ?? {} });
  }
  delete<T = any>(path: string) {
    return this.request<T>('DELETE', path);
  }

  async signUp(email: string, password: string, name = 'Test Person') {
    return this.post('/api/auth/sign-up/email', { email, password, name });
  }
  async signIn(email: string, password: string) {
    return this.post('/api/auth/sign-in/email', { email, password });
  }
  async signOut() {
    return this.post('/api/auth/sign-out', {});
  }
  get signedIn(): boolean {
    return [...this.cookies.keys()].some((k) => k.includes('session_token'));
  }
}

/** A unique address per call so suites running in parallel never collide. */
export function uniqueEmail(tag: string): string {
  return `${tag}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}@tests.example`;
}
