/**
 * A small fetch-based HTTP client for a listening app (a loopback port or a child process): keeps the
 * session cookie, fetches and sends the CSRF token, and bounds every request in time. Used where
 * supertest does not fit (other processes, load runs, many requests in a row).
 */
export type HttpResponse = { status: number; headers: Headers; text: string; body: unknown; ms: number };
export type RequestOptions = { json?: unknown; raw?: string; type?: string; csrf?: boolean | string; timeoutMs?: number; headers?: Record<string, string> };

/** `headers` go on every request (e.g. X-Forwarded-Proto: https for an app behind a TLS proxy). */
export function httpClient(baseUrl: string, defaults: { headers?: Record<string, string> } = {}) {
  const cookies = new Map<string, string>();
  let base = baseUrl;
  let token = '';

  function keepCookies(headers: Headers) {
    for (const line of headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      if (!value || /expires=thu, 01 jan 1970/i.test(line)) cookies.delete(name);
      else cookies.set(name, value);
    }
  }

  async function request(method: string, path: string, opts: RequestOptions = {}): Promise<HttpResponse> {
    const headers: Record<string, string> = { ...defaults.headers, ...opts.headers };
    const wantsCsrf = opts.csrf ?? method.toUpperCase() !== 'GET';
    // The token first: fetching it may start the session whose cookie this request must carry.
    if (wantsCsrf) headers['x-csrf-token'] = typeof wantsCsrf === 'string' ? wantsCsrf : await csrf();
    if (cookies.size) headers.cookie = [...cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    let body: string | undefined;
    if (opts.json !== undefined) {
      body = JSON.stringify(opts.json);
      headers['content-type'] = 'application/json';
    } else if (opts.raw !== undefined) {
      body = opts.raw;
      headers['content-type'] = opts.type ?? 'application/json';
    }
    const started = Date.now();
    const res = await fetch(base + path, {
      method: method.toUpperCase(),
      headers,
      body,
      redirect: 'manual',
      signal: AbortSignal.timeout(opts.timeoutMs ?? 15_000),
    });
    keepCookies(res.headers);
    const text = await res.text();
    let parsed: unknown;
    try {
      parsed = text ? JSON.parse(text) : undefined;
    } catch {
      parsed = undefined;
    }
    return { status: res.status, headers: res.headers, text, body: parsed, ms: Date.now() - started };
  }

  async function csrf(renew = false) {
    if (!token || renew) {
      const res = await request('GET', '/api/csrf', { csrf: false });
      if (res.status !== 200) throw new Error(`GET /api/csrf answered ${res.status}: ${res.text.slice(0, 200)}`);
      token = (res.body as { data: { token: string } }).data.token;
    }
    return token;
  }

  return {
    request,
    get: (path: string, opts?: RequestOptions) => request('GET', path, opts),
    post: (path: string, json?: unknown, opts?: RequestOptions) => request('POST', path, { ...opts, json }),
    patch: (path: string, json?: unknown, opts?: RequestOptions) => request('PATCH', path, { ...opts, json }),
    csrf,
    /** Forget the cached token (the session changed). */
    resetCsrf: () => {
      token = '';
    },
    cookie: (name = 'tw.sid') => cookies.get(name),
    /** Send the next requests to another instance, keeping the session (instances share it through PostgreSQL). */
    useBaseUrl: (url: string) => {
      base = url;
    },
    setCookie: (name: string, value: string) => cookies.set(name, value),
    async signIn(email: string, password: string) {
      const res = await request('POST', '/api/auth/sign-in', { json: { email, password } });
      if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${res.text.slice(0, 200)}`);
      token = '';
      return (res.body as { data: { user: { id: string } } }).data.user;
    },
  };
}
export type HttpClient = ReturnType<typeof httpClient>;
