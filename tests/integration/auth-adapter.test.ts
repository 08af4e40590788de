// The parts of next-auth that run on our code: the adapter methods the e-mail link flow calls
// (getUserByEmail → createUser or updateUser, createVerificationToken → useVerificationToken),
// the password provider's authorize, and the callbacks that put the user id in the session.
import { afterAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import type { AdapterUser } from "next-auth/adapters";
import { UserSchema } from "@/entities/user";
import { undertoneAdapter } from "@/lib/auth/adapter";
import { authOptions } from "@/lib/auth/options";
import { getEm, getOrm } from "@/lib/db";
import { address, makeUser } from "../support/fixtures";

const TAG = "auth-adapter";
const adapter = undertoneAdapter();

afterAll(async () => {
  await (await getOrm()).close();
});

describe("users", () => {
  it("createUser stores the address lower-cased and names the person after it", async () => {
    const email = address(TAG, "Tamsin.Reed");
    const verified = new Date("2026-03-04T05:06:07Z");
    const created = await adapter.createUser!({ email: email.toUpperCase(), emailVerified: verified } as Omit<AdapterUser, "id">);
    expect(created).toEqual({ id: expect.stringMatching(/^[0-9a-f-]{36}$/), email: email.toLowerCase(), name: email.split("@")[0].toLowerCase(), emailVerified: verified });
    const row = await (await getEm()).findOneOrFail(UserSchema, { id: created.id });
    expect(row.email).toBe(email.toLowerCase());
    expect(row.passwordHash).toBeNull();
  });

  it("createUser keeps a given name", async () => {
    const created = await adapter.createUser!({ email: address(TAG, "named"), name: " Ada Fenwick ", emailVerified: null } as Omit<AdapterUser, "id">);
    expect(created.name).toBe("Ada Fenwick");
  });

  it("getUserByEmail finds a person whatever the letter case, and no one for an unknown address", async () => {
    const p = await makeUser(TAG, "finder");
    expect(await adapter.getUserByEmail!(` ${p.email.toUpperCase()} `)).toMatchObject({ id: p.id, email: p.email });
    expect(await adapter.getUserByEmail!(address(TAG, "nobody"))).toBeNull();
  });

  it("getUser finds by id, and returns null for an id that does not exist", async () => {
    const p = await makeUser(TAG, "byid");
    expect(await adapter.getUser!(p.id)).toMatchObject({ id: p.id, email: p.email, name: p.name });
    expect(await adapter.getUser!(randomUUID())).toBeNull();
  });

  it("updateUser records the verification time and leaves the rest", async () => {
    const p = await makeUser(TAG, "verify");
    const at = new Date("2026-05-06T07:08:09Z");
    const updated = await adapter.updateUser!({ id: p.id, emailVerified: at });
    expect(updated).toEqual({ id: p.id, email: p.email, name: p.name, emailVerified: at });
    const row = await (await getEm()).findOneOrFail(UserSchema, { id: p.id });
    expect(row.emailVerified?.toISOString()).toBe(at.toISOString());
    expect(row.name).toBe(p.name);
  });

  it("accounts from other providers are not supported", async () => {
    expect(await adapter.getUserByAccount!({ provider: "x", providerAccountId: "1" })).toBeNull();
    await expect(
      adapter.linkAccount!({ userId: "u", type: "oauth", provider: "x", providerAccountId: "1" }),
    ).rejects.toThrow(/Only e-mail and password/);
  });
});

describe("verification tokens", () => {
  it("a token can be used once", async () => {
    const identifier = address(TAG, "link");
    const expires = new Date(Date.now() + 86_400_000);
    const token = randomUUID().replace(/-/g, "");
    expect(await adapter.createVerificationToken!({ identifier, token, expires })).toEqual({ identifier, token, expires });
    const used = await adapter.useVerificationToken!({ identifier, token });
    expect(used).toMatchObject({ identifier, token });
    expect(used!.expires.toISOString()).toBe(expires.toISOString());
    expect(await adapter.useVerificationToken!({ identifier, token })).toBeNull();
  });

  it("a wrong token or another address gets nothing and does not spend the right token", async () => {
    const identifier = address(TAG, "guarded");
    const token = randomUUID();
    await adapter.createVerificationToken!({ identifier, token, expires: new Date(Date.now() + 60_000) });
    expect(await adapter.useVerificationToken!({ identifier, token: randomUUID() })).toBeNull();
    expect(await adapter.useVerificationToken!({ identifier: address(TAG, "other"), token })).toBeNull();
    expect(await adapter.useVerificationToken!({ identifier: identifier.toUpperCase(), token })).toMatchObject({ identifier, token });
  });
});

describe("password sign-in", () => {
  // next-auth keeps the options given to CredentialsProvider (our id, our authorize) under
  // `options` and merges them in at run time.
  type Opts = { id?: string; authorize: (c: Record<string, string>, req: unknown) => Promise<unknown> };
  const provider = authOptions.providers.find((p) => (p as unknown as { options?: Opts }).options?.id === "password");
  const authorize = (c: Record<string, string>, req: unknown) => (provider as unknown as { options: Opts }).options.authorize(c, req);

  it("the right password signs in as that person", async () => {
    const p = await makeUser(TAG, "keyholder", { password: "indigo vat at dawn" });
    expect(await authorize({ email: p.email, password: "indigo vat at dawn" }, {})).toEqual({ id: p.id, email: p.email, name: p.name });
    expect(await authorize({ email: ` ${p.email.toUpperCase()} `, password: "indigo vat at dawn" }, {})).toMatchObject({ id: p.id });
  });

  it("a wrong password, an unknown address, a link-only account or a bad form sign in no one", async () => {
    const p = await makeUser(TAG, "locked", { password: "madder root" });
    const linkOnly = await makeUser(TAG, "linkonly");
    expect(await authorize({ email: p.email, password: "Madder root" }, {})).toBeNull();
    expect(await authorize({ email: p.email, password: "" }, {})).toBeNull();
    expect(await authorize({ email: address(TAG, "ghost"), password: "madder root" }, {})).toBeNull();
    expect(await authorize({ email: linkOnly.email, password: "anything" }, {})).toBeNull();
    expect(await authorize({ email: "not an address", password: "madder root" }, {})).toBeNull();
  });
});

describe("session callbacks", () => {
  it("the user id travels from sign-in into the token and from the token into the session", async () => {
    const jwt = authOptions.callbacks!.jwt!;
    const session = authOptions.callbacks!.session!;
    const token = await jwt({ token: { sub: "x" }, user: { id: "u-1", email: "a@b.test" } } as never);
    expect(token.uid).toBe("u-1");
    // Later requests carry no user; the id must survive.
    expect((await jwt({ token } as never)).uid).toBe("u-1");
    const s = await session({ session: { user: { email: "a@b.test" }, expires: "" }, token } as never);
    expect((s.user as { id?: string }).id).toBe("u-1");
  });
});
