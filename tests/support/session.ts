// The session boundary, faked for integration tests. A test file mocks next-auth with
//   vi.mock("next-auth", async (orig) => ({ ...(await orig<object>()), getServerSession: fakeGetServerSession }));
// (importing fakeGetServerSession inside the factory) and then picks who is signed in with
// actAs(user) or actAs(null). Everything behind the session — database, permissions,
// handlers — stays real.
export interface FakeSessionUser {
  id: string;
  email: string;
  name: string;
}

const state = globalThis as unknown as { __undertoneFakeSession?: FakeSessionUser | null };

/** Who the next requests come from; null means signed out. */
export function actAs(user: FakeSessionUser | null): void {
  state.__undertoneFakeSession = user ? { id: user.id, email: user.email, name: user.name } : null;
}

/** Stands in for next-auth's getServerSession: the shape next-auth returns for a JWT session. */
export async function fakeGetServerSession() {
  const u = state.__undertoneFakeSession;
  if (!u) return null;
  return { user: { id: u.id, email: u.email, name: u.name }, expires: new Date(Date.now() + 86_400_000).toISOString() };
}
