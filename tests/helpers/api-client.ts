import path from 'node:path';
import knex, { type Knex } from 'knex';
import { inject } from 'vitest';
import { sqliteSettings } from '../../src/lib/server/db';

/** A caller of the running test server with its own cookie jar, as a browser would be. */
export class TestClient {
  private readonly cookies = new Map<string, string>();

  constructor(readonly baseUrl: string = inject('baseUrl')) {}

  get origin(): string {
    return this.baseUrl;
  }

  async request(method: string, route: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const init: RequestInit = { method, redirect: 'manual', headers: { Origin: this.origin, ...this.cookieHeader(), ...headers } };
    if (body !== undefined) {
      init.body = typeof body === 'string' ? body : body instanceof Uint8Array ? new Uint8Array(body) : JSON.stringify(body);
      (init.headers as Record<string, string>)['Content-Type'] ??= 'application/json';
    }
    const response = await fetch(this.baseUrl + route, init);
    this.keepCookies(response);
    return response;
  }

  async json<T = Record<string, unknown>>(method: string, route: string, body?: unknown): Promise<{ status: number; body: T }> {
    const response = await this.request(method, route, body);
    const text = await response.text();
    return { status: response.status, body: (text ? JSON.parse(text) : {}) as T };
  }

  async signUp(account: { email: string; name: string; password: string }): Promise<number> {
    const { status, body } = await this.json<{ user: { id: number } }>('POST', '/api/accounts', account);
    if (status !== 201) throw new Error(`sign-up failed: ${status} ${JSON.stringify(body)}`);
    return body.user.id;
  }

  /** Signs in through Auth.js exactly as the sign-in page does; returns the answer's redirect URL. */
  async signIn(email: string, password: string): Promise<{ status: number; url?: string; error?: string }> {
    const csrf = await this.json<{ csrfToken: string }>('GET', '/api/auth/csrf');
    const response = await this.request(
      'POST',
      '/api/auth/callback/credentials',
      new URLSearchParams({ email, password, csrfToken: csrf.body.csrfToken, callbackUrl: '/app' }).toString(),
      { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Auth-Return-Redirect': '1' },
    );
    const body = (await response.json().catch(() => ({}))) as { url?: string; error?: string };
    return { status: response.status, ...body };
  }

  get signedIn(): boolean {
    return [...this.cookies.keys()].some((name) => name.endsWith('authjs.session-token'));
  }

  private cookieHeader(): Record<string, string> {
    if (this.cookies.size === 0) return {};
    return { Cookie: [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; ') };
  }

  private keepCookies(response: Response): void {
    for (const cookie of response.headers.getSetCookie()) {
      const [pair] = cookie.split(';');
      const at = pair!.indexOf('=');
      const name = pair!.slice(0, at).trim();
      const value = pair!.slice(at + 1).trim();
      if (value === '' || /max-age=0|expires=thu, 01 jan 1970/i.test(cookie)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }
}

let counter = 0;
/** A fresh, unique account for one test. */
export function newAccount(label: string) {
  counter += 1;
  const unique = `${label}-${process.pid}-${Date.now().toString(36)}-${counter}`;
  return { email: `${unique}@test.example`, name: `Test ${label} ${counter}`, password: 'correct horse battery' };
}

/** Signs up and signs in a new account; returns the client and the user id. */
export async function signedInClient(label: string): Promise<{ client: TestClient; userId: number; email: string }> {
  const client = new TestClient();
  const account = newAccount(label);
  const userId = await client.signUp(account);
  const result = await client.signIn(account.email, account.password);
  if (!client.signedIn) throw new Error(`sign-in failed for ${account.email}: ${JSON.stringify(result)}`);
  return { client, userId, email: account.email };
}

let testDb: Knex | undefined;
/** The test server's own SQLite file, opened beside it (WAL lets both work at once). */
export function serverDb(): Knex {
  testDb ??= knex(sqliteSettings(path.join(inject('dataDir'), 'gullyline.sqlite')));
  return testDb;
}

export async function closeServerDb(): Promise<void> {
  await testDb?.destroy();
  testDb = undefined;
}

export async function rowCounts(...tables: string[]): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const table of tables) {
    const [row] = await serverDb()(table).count<{ n: number }[]>({ n: '*' });
    counts[table] = Number(row?.n ?? 0);
  }
  return counts;
}
