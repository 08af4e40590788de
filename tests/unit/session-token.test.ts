// Reading the session cookie without next-auth's request handler (lib/auth/session-token.ts):
// tokens are made with next-auth's own encode, so this checks that both sides agree.
import { randomUUID } from "node:crypto";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { encode } from "next-auth/jwt";

const jar = new Map<string, string>();
vi.mock("next/headers", () => ({
  cookies: async () => ({
    get: (name: string) => (jar.has(name) ? { name, value: jar.get(name)! } : undefined),
    getAll: () => [...jar].map(([name, value]) => ({ name, value })),
  }),
}));

const { authOptions } = await import("@/lib/auth/options");
const { sessionCookieName, sessionUserIdFromCookies, userIdFromToken } = await import("@/lib/auth/session-token");
const secret = authOptions.secret!;

beforeEach(() => jar.clear());

describe("userIdFromToken", () => {
  it("reads the user id next-auth sealed into the token", async () => {
    const uid = randomUUID();
    const token = await encode({ token: { uid, email: "a@example.test" }, secret });
    expect(await userIdFromToken(token)).toBe(uid);
    expect(await userIdFromToken(token)).toBe(uid); // remembered
  });

  it("refuses a token sealed with another secret, a changed one, and one without a user id", async () => {
    const uid = randomUUID();
    expect(await userIdFromToken(await encode({ token: { uid }, secret: "another secret entirely, 32+ chars" }))).toBeNull();
    const good = await encode({ token: { uid }, secret });
    const i = good.length - 10;
    const changed = good.slice(0, i) + (good[i] === "A" ? "B" : "A") + good.slice(i + 1);
    expect(await userIdFromToken(changed)).toBeNull();
    expect(await userIdFromToken("not-a-token")).toBeNull();
    expect(await userIdFromToken(await encode({ token: { email: "b@example.test" }, secret }))).toBeNull();
    expect(await userIdFromToken(await encode({ token: { uid: "1; drop table users" }, secret }))).toBeNull();
  });

  it("refuses an expired token, also one it has seen while it was valid", async () => {
    const uid = randomUUID();
    const token = await encode({ token: { uid }, secret, maxAge: 60 });
    expect(await userIdFromToken(token)).toBe(uid);
    expect(await userIdFromToken(token, Date.now() + 61_000)).toBeNull();
    const old = await encode({ token: { uid }, secret, maxAge: -1 });
    expect(await userIdFromToken(old)).toBeNull();
  });
});

describe("sessionUserIdFromCookies", () => {
  it("reads next-auth's cookie over http (no __Secure- prefix here), whole or in chunks", async () => {
    expect(sessionCookieName()).toBe("next-auth.session-token");
    expect(await sessionUserIdFromCookies()).toBeNull();
    const uid = randomUUID();
    const token = await encode({ token: { uid }, secret });
    jar.set("next-auth.session-token", token);
    expect(await sessionUserIdFromCookies()).toBe(uid);
    jar.clear();
    // next-auth splits a token longer than a cookie may be into NAME.0, NAME.1, …; order by number.
    const cut = Math.floor(token.length / 3);
    jar.set("next-auth.session-token.2", token.slice(2 * cut));
    jar.set("next-auth.session-token.0", token.slice(0, cut));
    jar.set("next-auth.session-token.1", token.slice(cut, 2 * cut));
    jar.set("next-auth.session-token.x", "ignored");
    expect(await sessionUserIdFromCookies()).toBe(uid);
    jar.clear();
    jar.set("other.session-token", token);
    expect(await sessionUserIdFromCookies()).toBeNull();
  });
});
