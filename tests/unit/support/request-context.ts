// The request a test pretends to be in: which lucia session cookie `cookies()` returns.
// Kept free of app imports so vi.mock factories can load it before anything else.

const jar = new Map<string, string>();

/** Stands in for `cookies()` from next/headers: reads the test's cookie, ignores what the app sets. */
export const nextHeadersMock = {
  cookies: async () => ({
    get: (name: string) => (jar.has(name) ? { name, value: jar.get(name)! } : undefined),
    set: () => undefined,
    delete: () => undefined,
  }),
  headers: async () => new Headers(),
};

export function setSessionCookie(name: string, value: string | null) {
  jar.clear();
  if (value) jar.set(name, value);
}
