// Request bodies no form would send: nested past any document, text the database cannot hold.
// Each is refused with a status a person can act on, never by the stack running out.
import { describe, expect, it } from "vitest";
import { MAX_BODY_BYTES, readJson } from "@/lib/auth/with-studio";
import { HttpError } from "@/lib/errors";
import { commentDoc } from "@/lib/schemas/comment";
import { baseListQuery, dyeListQuery, stockListQuery } from "@/lib/schemas/library";
import { trialInput, trialQuery } from "@/lib/schemas/trial";
import { notesText } from "@/lib/trials/notes";

const nested = (depth: number) => JSON.parse(`${"[".repeat(depth)}1${"]".repeat(depth)}`);
const deepDoc = (depth: number) =>
  JSON.parse(`{"type":"doc","content":[${'{"type":"bulletList","content":['.repeat(depth)}{"type":"paragraph"}${"]}".repeat(depth)}]}`);

async function read(body: string): Promise<unknown> {
  return readJson(new Request("http://127.0.0.1/x", { method: "POST", body }));
}

async function statusOf(body: string): Promise<number | "ok"> {
  try {
    await read(body);
    return "ok";
  } catch (e) {
    if (e instanceof HttpError) return e.status;
    throw e;
  }
}

describe("readJson", () => {
  it("reads ordinary bodies, and an empty one as {}", async () => {
    expect(await read('{"title":"Moss dip","tags":["speckle"]}')).toEqual({ title: "Moss dip", tags: ["speckle"] });
    expect(await read("  ")).toEqual({});
  });

  it("refuses nesting deeper than any body the app takes with a 400", async () => {
    expect(await statusOf(JSON.stringify(nested(60)))).toBe("ok");
    expect(await statusOf(`${"[".repeat(65)}${"]".repeat(65)}`)).toBe(400);
    expect(await statusOf(`{"a":${"[".repeat(50_000)}${"]".repeat(50_000)}}`)).toBe(400);
    // Brackets inside strings do not count.
    expect(await statusOf(JSON.stringify({ note: "[".repeat(500) }))).toBe("ok");
  });

  it("refuses a body over 1 MB with a 413 (declared or streamed), and reads one just under it", async () => {
    const text = (n: number) => JSON.stringify({ notes: "x".repeat(n - 12) }); // {"notes":"…"} is 12 bytes more
    expect(await statusOf(text(MAX_BODY_BYTES))).toBe("ok");
    expect(await statusOf(text(MAX_BODY_BYTES + 1))).toBe(413);
    // No length given: counted while streaming, and the stream is left after the limit.
    let pulled = 0;
    const chunk = new TextEncoder().encode("[" + "1,".repeat(32_767));
    const endless = new ReadableStream<Uint8Array>({
      pull(c) {
        pulled++;
        c.enqueue(chunk);
      },
    });
    const req = new Request("http://127.0.0.1/x", { method: "POST", body: endless, duplex: "half" } as RequestInit);
    await expect(readJson(req)).rejects.toMatchObject({ status: 413, message: expect.stringContaining("over 1 MB") });
    expect(pulled).toBeLessThan(Math.ceil(MAX_BODY_BYTES / chunk.byteLength) + 3);
    // A length header that overstates is believed: refused before a byte is read.
    const lying = new Request("http://127.0.0.1/x", { method: "POST", body: "{}", headers: { "content-length": "5000000" } });
    await expect(readJson(lying)).rejects.toMatchObject({ status: 413 });
  });

  it("refuses text PostgreSQL cannot store with a 422: NUL, and half a surrogate pair", async () => {
    expect(await statusOf('{"title":"a\\u0000b"}')).toBe(422);
    expect(await statusOf('{"tags":["\\ud83e"]}')).toBe(422);
    expect(await statusOf('{"a\\u0000":1}')).toBe(422);
    // A whole emoji, and a backslash followed by "u0000" as plain text, are fine.
    expect(await read('{"title":"\\ud83e\\uddf6 skein","note":"\\\\u0000"}')).toEqual({ title: "🧶 skein", note: "\\u0000" });
  });
});

describe("schemas given values nested past the stack's depth", () => {
  it("a comment document is refused, not a crash", () => {
    expect(commentDoc.safeParse(deepDoc(20_000)).success).toBe(false);
    expect(commentDoc.safeParse({ type: "doc", content: new Array(300_000).fill(1) }).success).toBe(false);
  });

  it("trial notes are refused, not a crash", () => {
    const res = trialInput.safeParse({ title: "Deep notes", fibreWeightG: 100, notes: deepDoc(20_000) });
    expect(res.success).toBe(false);
  });

  it("still take an ordinary document", () => {
    const doc = { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "Dip to the halfway mark." }] }] };
    expect(commentDoc.safeParse(doc).success).toBe(true);
    expect(trialInput.safeParse({ title: "Notes", fibreWeightG: 100, notes: doc }).success).toBe(true);
  });
});

describe("notesText", () => {
  it("skips what is not a node (notes stored before the schema checked every node)", () => {
    const doc = { type: "doc", content: [null, 5, "loose", { type: "paragraph", content: [null, { type: "text", text: "Rinse warm." }] }] };
    expect(notesText(doc)).toBe("Rinse warm.");
  });
});

describe("list queries", () => {
  it("refuse a NUL in the search or tag (PostgreSQL refuses it in a text parameter)", () => {
    expect(trialQuery.safeParse({ q: "moss\u0000" }).success).toBe(false);
    expect(trialQuery.safeParse({ tag: "\u0000" }).success).toBe(false);
    for (const schema of [baseListQuery, dyeListQuery, stockListQuery]) expect(schema.safeParse({ q: "a\u0000" }).success).toBe(false);
    expect(trialQuery.safeParse({ q: "moss", tag: "speckle" }).success).toBe(true);
  });
});
