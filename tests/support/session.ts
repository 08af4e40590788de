// The session boundary, faked for integration tests. A test file mocks the session cookie reader with
//   vi.mock("@/lib/auth/session-token", async (orig) => ({ ...(await orig<object>()), sessionUserIdFromCookies: fakeSessionUserId }));
// (importing fakeSessionUserId inside the factory) and then picks who is signed in with
// actAs(user) or actAs(null). Everything behind the session — database, permissions,
// handlers — stays real. Requests that run at the same time as different people use
// runAs(user, fn): the person travels with the async call chain, not in a global.
import { AsyncLocalStorage } from "node:async_hooks";

export interface FakeSessionUser {
  id: string;
  email: string;
  name: string;
}

const state = globalThis as unknown as {
  __undertoneFakeSession?: FakeSessionUser | null;
  __undertoneFakeSessionScope?: AsyncLocalStorage<FakeSessionUser | null>;
};
const scope = (state.__undertoneFakeSessionScope ??= new AsyncLocalStorage<FakeSessionUser | null>());

const strip = (user: FakeSessionUser | null) => (user ? { id: user.id, email: user.email, name: user.name } : null);

/** Who the next requests come from; null means signed out. */
export function actAs(user: FakeSessionUser | null): void {
  state.__undertoneFakeSession = strip(user);
}

/** Runs `fn` (and everything it awaits) as `user`, whatever actAs says meanwhile. */
export function runAs<T>(user: FakeSessionUser | null, fn: () => Promise<T>): Promise<T> {
  return scope.run(strip(user), fn);
}

/** Stands in for reading the session cookie (lib/auth/session-token.ts): the id of who is signed in. */
export async function fakeSessionUserId(): Promise<string | null> {
  const scoped = scope.getStore();
  const u = scoped !== undefined ? scoped : state.__undertoneFakeSession;
  return u ? u.id : null;
}
