// A stand-in for next/headers outside a Next.js request: the cookies one browser would send, which a
// server action may replace (as Next.js would with Set-Cookie). Tests that mock next/headers with it
// run the real session code — next-auth decodes the cookie and runs the real jwt callback.

interface SetCookie {
  name: string;
  value: string;
  options: Record<string, unknown>;
}

const jar = new Map<string, string>();
const written: SetCookie[] = [];

export const browser = {
  /** the cookies the next request sends (replaces all of them) */
  use(cookies: Record<string, string>): void {
    jar.clear();
    for (const [name, value] of Object.entries(cookies)) jar.set(name, value);
  },
  cookie(name: string): string | undefined {
    return jar.get(name);
  },
  /** every cookie a server action set since the last call, oldest first */
  takeWritten(): SetCookie[] {
    return written.splice(0, written.length);
  },
};

const cookieStore = {
  getAll: () => [...jar].map(([name, value]) => ({ name, value })),
  get: (name: string) => (jar.has(name) ? { name, value: jar.get(name)! } : undefined),
  set(name: string, value: string, options: Record<string, unknown> = {}) {
    jar.set(name, value);
    written.push({ name, value, options });
    return cookieStore;
  },
};

export const nextHeaders = {
  headers: async () => new Headers({ "x-forwarded-for": "198.51.100.40" }),
  cookies: async () => cookieStore,
};
