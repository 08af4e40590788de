// The local services as the app uses them: the s3rver fake through lib/storage, the SMTP
// fake through lib/mail, and lib/health over all three (database = undertone_test).
import { afterAll, describe, expect, it } from "vitest";
import { randomBytes, randomUUID } from "node:crypto";
import { deleteObject, getObject, headObject, presignGet, presignPut, putObject } from "@/lib/storage";
import { sendMail, smtpOptions } from "@/lib/mail";
import { checkHealth } from "@/lib/health";
import { getOrm } from "@/lib/db";
import { env } from "@/lib/env";
import { clearMessages, getMessage, linksIn, listMessages, waitForMessage } from "../support/mail";

// Every byte value, twice, then random bytes: a corrupted or re-encoded upload shows.
const sample = () => Buffer.concat([Buffer.from(Array.from({ length: 512 }, (_, i) => i % 256)), randomBytes(4096)]);
const key = (name: string) => `tests/${randomUUID()}/${name}`;

afterAll(async () => {
  await (await getOrm()).close();
});

describe("object store", () => {
  it("stores, describes, returns and deletes an object", async () => {
    const k = key("swatch.jpg");
    const bytes = sample();
    await putObject(k, bytes, "image/jpeg");
    expect(await headObject(k)).toMatchObject({ size: bytes.length, contentType: "image/jpeg" });
    expect(Buffer.compare((await getObject(k))!, bytes)).toBe(0);
    await deleteObject(k);
    expect(await headObject(k)).toBeNull();
    expect(await getObject(k)).toBeNull();
  });

  it("accepts a presigned PUT from fetch and serves it through a presigned GET", async () => {
    const k = key("card.png");
    const bytes = sample();
    const put = await presignPut(k, "image/png");
    expect(put).not.toMatch(/x-amz-checksum|x-amz-sdk-checksum/i);
    const res = await fetch(put, { method: "PUT", body: bytes, headers: { "content-type": "image/png" } });
    expect(res.status).toBe(200);
    expect(await headObject(k)).toMatchObject({ size: bytes.length, contentType: "image/png" });

    const got = await fetch(await presignGet(k));
    expect(got.status).toBe(200);
    expect(Buffer.compare(Buffer.from(await got.arrayBuffer()), bytes)).toBe(0);
    await deleteObject(k);
  });

  it("signs the content type into a presigned PUT", async () => {
    // s3rver does not verify V4 signatures, so only the URL itself can show this.
    const url = new URL(await presignPut(key("typed.png"), "image/png"));
    expect(url.searchParams.get("X-Amz-SignedHeaders")?.split(";")).toEqual(["content-type", "host"]);
    expect(Number(url.searchParams.get("X-Amz-Expires"))).toBe(300);
  });

  it("lets a browser on the app origin PUT (CORS preflight)", async () => {
    const put = await presignPut(key("cors.png"), "image/png");
    const res = await fetch(put, {
      method: "OPTIONS",
      headers: {
        origin: "http://127.0.0.1:3000",
        "access-control-request-method": "PUT",
        "access-control-request-headers": "content-type",
      },
    });
    expect(res.status).toBe(200);
    expect(res.headers.get("access-control-allow-origin")).toMatch(/^(\*|http:\/\/127\.0\.0\.1:3000)$/);
    expect(res.headers.get("access-control-allow-methods")).toContain("PUT");
  });
});

describe("mail", () => {
  it("reads smtp:// and smtps:// URLs", () => {
    expect(smtpOptions("smtp://127.0.0.1:2525")).toEqual({ host: "127.0.0.1", port: 2525, secure: false, ignoreTLS: true });
    expect(smtpOptions("smtps://u%40x:p@mail.example:465")).toMatchObject({
      port: 465,
      secure: true,
      ignoreTLS: false,
      auth: { user: "u@x", pass: "p" },
    });
  });

  it("delivers through SMTP to the fake, which lists, filters, returns and clears it", async () => {
    const to = `dyer-${randomUUID().slice(0, 8)}@studio.test`;
    const link = "http://127.0.0.1:3000/invite/abc123";
    await sendMail({ to, subject: "Your studio invitation", text: `Open ${link} to join.`, html: `<p><a href="${link}">Join</a></p>` });
    const other = `other-${randomUUID().slice(0, 8)}@studio.test`;
    await sendMail({ to: other, subject: "Other", text: "x" });

    const m = await waitForMessage(to);
    expect(m.subject).toBe("Your studio invitation");
    expect(m.to).toEqual([to]);
    expect(m.from).toBe(env.MAIL_FROM.match(/<(.+)>/)?.[1] ?? env.MAIL_FROM);
    expect(m.html).toContain(`href="${link}"`);
    expect(linksIn(m)).toEqual([link]);
    expect(await getMessage(m.id)).toEqual(m);
    expect((await listMessages(to)).map((x) => x.id)).toEqual([m.id]);
    expect((await waitForMessage(other)).subject).toBe("Other");
    expect((await listMessages()).map((x) => x.id)).toEqual(expect.arrayContaining([m.id]));

    expect(await clearMessages()).toBeGreaterThanOrEqual(2);
    expect(await listMessages(to)).toEqual([]);
    expect(await listMessages(other)).toEqual([]);
  });

  it("gives up waiting when nothing arrives", async () => {
    await expect(waitForMessage("nobody@studio.test", { timeoutMs: 300 })).rejects.toThrow(/no message/);
  });
});

describe("health", () => {
  it("reports all three services up", async () => {
    const h = await checkHealth();
    expect(h.checks.database).toMatchObject({ ok: true });
    expect(h.checks.storage).toMatchObject({ ok: true });
    expect(h.checks.mail).toMatchObject({ ok: true });
    expect(h.ok).toBe(true);
  });

  it("reports a failing or silent database check", async () => {
    const failing = await checkHealth({ database: () => Promise.reject(new Error("connection refused")) });
    expect(failing.ok).toBe(false);
    expect(failing.checks.database).toMatchObject({ ok: false, error: "connection refused" });
    expect(failing.checks.storage.ok).toBe(true);

    const silent = await checkHealth({ database: () => new Promise(() => {}), timeoutMs: 200 });
    expect(silent.checks.database).toMatchObject({ ok: false, error: "no answer within 200 ms" });
    expect(silent.checks.database.ms).toBeGreaterThanOrEqual(190);
  });
});
