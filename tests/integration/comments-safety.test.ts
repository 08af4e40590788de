// Comments are safe to show and stay inside their studio: markup and script in a comment are
// stored as text and rendered inert, unsafe links and unknown nodes are refused, mentions must
// name members, a member of another studio can neither read nor post, and only authors edit,
// while authors and owners remove.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { CommentSchema } from "@/entities/comment";
import { PhotoSchema } from "@/entities/photo";
import { getEm, getOrm } from "@/lib/db";
import * as commentsRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comments/route";
import * as commentRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comments/[commentId]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { doc, link, makeTrial, mention, text } from "../support/comments";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "comments-safety";
let owner: Person, dyer: Person, guest: Person, outsider: Person;
let studio: StudioFixture, elsewhere: StudioFixture;
let trial: { id: string; layerIds: string[] };
let foreignTrial: { id: string; layerIds: string[] };

beforeAll(async () => {
  [owner, dyer, guest, outsider] = await Promise.all(["owner", "dyer", "guest", "outsider"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Saltmarsh Dye Room", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  elsewhere = await makeStudio("Far Hill Fibre", [[outsider, "owner"]]);
  trial = await makeTrial(studio.id, dyer, "Lichen over walnut", 2);
  foreignTrial = await makeTrial(elsewhere.id, outsider, "Their own trial");
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

const tp = () => ({ studioId: studio.id, trialId: trial.id });
const post = (body: unknown) => call(commentsRoute.POST, "POST", tp(), { body });
const list = () => call(commentsRoute.GET, "GET", tp());

describe("markup and links", () => {
  it("stores a script tag as text and renders it inert", async () => {
    actAs(dyer);
    const evil = '<script>alert("x")</script><img src=x onerror=alert(1)>';
    const res = await post({ body: doc(text(evil)) });
    expect(res.status).toBe(201);
    // Stored exactly as typed…
    const em = await getEm();
    const row = await em.findOneOrFail(CommentSchema, { id: res.json.id });
    expect(row.bodyText).toBe(evil);
    // …and shown as text, never as elements.
    expect(res.json.html).toBe('<p>&lt;script&gt;alert("x")&lt;/script&gt;&lt;img src=x onerror=alert(1)&gt;</p>');
    expect(res.json.html.match(/<[a-z]+/gi)).toEqual(["<p"]);
    const again = (await list()).json.find((c: { id: string }) => c.id === res.json.id);
    expect(again.html).toBe(res.json.html);
  });

  it("refuses a javascript: link with 422 and a message", async () => {
    actAs(dyer);
    const res = await post({ body: doc(text("click me", [link("javascript:alert(document.cookie)")])) });
    expect(res.status).toBe(422);
    expect(res.json.error).toMatch(/http:\/\/, https:\/\/ or mailto:/);
    // Obfuscated spellings are caught too (the URL parser strips tabs and reads the scheme).
    const tabbed = await post({ body: doc(text("x", [link("java\tscript:alert(1)")])) });
    expect(tabbed.status).toBe(422);
  });

  it("renders a javascript: link that reached the database without its href", async () => {
    // As if written by an older version or by hand: the renderer and sanitizer still disarm it.
    const em = await getEm();
    const body = doc(text("old link", [link("javascript:alert(1)")]), text(" and "), text("good", [link("https://example.org/a?b=1")]));
    const row = em.create(CommentSchema, { studio: studio.id, trial: trial.id, author: dyer.id, body: body as never, bodyText: "old link and good" });
    await em.flush();
    actAs(guest);
    const shown = (await list()).json.find((c: { id: string }) => c.id === row.id);
    expect(shown.html).not.toMatch(/javascript:/i);
    expect(shown.html).toContain("old link");
    expect(shown.html).toContain('<a href="https://example.org/a?b=1" rel="noopener noreferrer nofollow ugc" target="_blank">good</a>');
  });

  it("keeps bold, italic, lists, links, mentions and swatches", async () => {
    actAs(dyer);
    const body = {
      type: "doc",
      content: [
        { type: "paragraph", content: [text("strong", [{ type: "bold" }]), text(" and "), text("soft", [{ type: "italic" }])] },
        { type: "bulletList", content: [{ type: "listItem", content: [{ type: "paragraph", content: [text("one")] }] }] },
        { type: "paragraph", content: [mention(guest), text(" see "), { type: "swatch", attrs: { hex: "#7A3B5C" } }] },
      ],
    };
    const res = await post({ body });
    expect(res.status).toBe(201);
    expect(res.json.html).toContain("<strong>strong</strong>");
    expect(res.json.html).toContain("<em>soft</em>");
    expect(res.json.html).toContain("<ul><li><p>one</p></li></ul>");
    expect(res.json.html).toContain(`<span class="mention" data-user-id="${guest.id}">@${guest.name}</span>`);
    expect(res.json.html).toContain('<span class="swatch-dot" style="background-color:#7a3b5c"></span>#7a3b5c');
    expect(res.json.mentions).toEqual([{ id: guest.id, name: guest.name }]);
  });

  it.each([
    ["a raw html node", { type: "doc", content: [{ type: "html", content: "<b>x</b>" }] }],
    ["an image", doc({ type: "image", attrs: { src: "https://example.org/x.png" } })],
    ["a heading", { type: "doc", content: [{ type: "heading", attrs: { level: 1 }, content: [text("x")] }] }],
    ["a swatch with a style instead of a colour", doc({ type: "swatch", attrs: { hex: "red;background:url(x)" } })],
    ["an unknown mark", doc(text("x", [{ type: "code" }]))],
    ["an empty paragraph", doc()],
  ])("refuses %s (422)", async (_n, body) => {
    actAs(dyer);
    const res = await post({ body });
    expect(res.status).toBe(422);
    expect(res.json.fields.body ?? Object.values(res.json.fields)[0]).toMatch(/.+/);
  });

  it("shows a mention with the member's own name, whatever label was sent", async () => {
    actAs(dyer);
    const res = await post({ body: doc(mention(guest, "The Owner")) });
    expect(res.status).toBe(201);
    expect(res.json.html).toContain(`@${guest.name}`);
    expect(res.json.html).not.toContain("The Owner");
  });
});

describe("mentions", () => {
  it("refuses a mention of someone outside the studio with 422 and a message", async () => {
    actAs(dyer);
    const res = await post({ body: doc(text("ask "), mention(outsider)) });
    expect(res.status).toBe(422);
    expect(res.json.error).toMatch(/Only members of this studio can be mentioned/);
    const em = await getEm();
    expect(await em.count(CommentSchema, { trial: trial.id, mentions: { $contains: [outsider.id] } })).toBe(0);
  });

  it("refuses a mention of an id that is nobody", async () => {
    actAs(dyer);
    const res = await post({ body: doc(mention({ id: "00000000-0000-4000-8000-000000000000", name: "ghost" })) });
    expect(res.status).toBe(422);
  });
});

describe("studio boundaries", () => {
  it("a member of another studio can neither read nor post (404)", async () => {
    actAs(outsider);
    expect((await list()).status).toBe(404);
    expect((await post({ body: doc(text("hello")) })).status).toBe(404);
  });

  it("a trial of another studio is not found through this studio's address", async () => {
    actAs(dyer);
    const p = { studioId: studio.id, trialId: foreignTrial.id };
    expect((await call(commentsRoute.GET, "GET", p)).status).toBe(404);
    expect((await call(commentsRoute.POST, "POST", p, { body: { body: doc(text("x")) } })).status).toBe(404);
  });

  it("signed-out callers get 401", async () => {
    actAs(null);
    expect((await list()).status).toBe(401);
  });

  it("a layer of another trial is refused", async () => {
    const other = await makeTrial(studio.id, dyer, "Second trial", 1);
    actAs(dyer);
    const res = await post({ body: doc(text("on a layer")), layerId: other.layerIds[0] });
    expect(res.status).toBe(422);
    expect(res.json.fields.layerId).toMatch(/layer of this trial/);
    const ok = await post({ body: doc(text("on layer 1")), layerId: trial.layerIds[0] });
    expect(ok.status).toBe(201);
    expect(ok.json.layerId).toBe(trial.layerIds[0]);
    expect(ok.json.layerNumber).toBe(1);
    const all = await list();
    expect(all.json.find((c: { id: string }) => c.id === ok.json.id).layerNumber).toBe(1);
    // ?layerId= keeps only that layer's thread.
    const onLayer = await commentsRoute.GET(new Request(`http://127.0.0.1/x?layerId=${trial.layerIds[0]}`), { params: Promise.resolve(tp()) });
    expect((await onLayer.json()).map((c: { id: string }) => c.id)).toEqual([ok.json.id]);
  });

  it("a photo must be one of this trial's; then the comment is about it", async () => {
    const other = await makeTrial(studio.id, dyer, "Third trial");
    const em = await getEm();
    const photo = (trialId: string) =>
      em.create(PhotoSchema, { studio: studio.id, trial: trialId, kind: "final", uploadedBy: dyer.id, status: "ready", uploadKey: `test/${trialId}` });
    const theirs = photo(other.id);
    const ours = photo(trial.id);
    await em.flush();
    actAs(guest);
    const refused = await post({ body: doc(text("on a photo")), photoId: theirs.id });
    expect(refused.status).toBe(422);
    expect(refused.json.fields.photoId).toMatch(/photo of this trial/);
    const ok = await post({ body: doc(text("lovely light in this one")), photoId: ours.id });
    expect([ok.status, ok.json.photoId]).toEqual([201, ours.id]);
    const res = await commentsRoute.GET(new Request(`http://127.0.0.1/x?photoId=${ours.id}`), { params: Promise.resolve(tp()) });
    expect((await res.json()).map((c: { id: string }) => c.id)).toEqual([ok.json.id]);
  });
});

describe("who may edit and remove", () => {
  it("guests may comment, but not remove or edit others' comments", async () => {
    actAs(dyer);
    const dyers = await post({ body: doc(text("dyer's note")) });
    actAs(guest);
    const mine = await post({ body: doc(text("a guest's view")) });
    expect(mine.status).toBe(201);
    const p = { ...tp(), commentId: dyers.json.id };
    expect((await call(commentRoute.DELETE, "DELETE", p)).status).toBe(403);
    expect((await call(commentRoute.PATCH, "PATCH", p, { body: { body: doc(text("changed")), version: 1 } })).status).toBe(403);
    // Their own: yes.
    const own = { ...tp(), commentId: mine.json.id };
    const edited = await call(commentRoute.PATCH, "PATCH", own, { body: { body: doc(text("a guest's second view")), version: mine.json.version } });
    expect(edited.status).toBe(200);
    expect(edited.json.editedAt).not.toBeNull();
    expect(edited.json.html).toBe("<p>a guest's second view</p>");
    expect((await call(commentRoute.DELETE, "DELETE", own)).status).toBe(204);
  });

  it("an owner removes anyone's comment; it stays in the thread without its text", async () => {
    actAs(guest);
    const c = await post({ body: doc(text("to be removed")) });
    actAs(owner);
    expect((await call(commentRoute.DELETE, "DELETE", { ...tp(), commentId: c.json.id })).status).toBe(204);
    const shown = (await list()).json.find((x: { id: string }) => x.id === c.json.id);
    expect(shown.deletedAt).not.toBeNull();
    expect(shown.html).toBe("");
    expect(shown.body).toBeNull();
    expect(shown.canDelete).toBe(false);
  });

  it("an owner may not edit someone else's comment", async () => {
    actAs(dyer);
    const c = await post({ body: doc(text("mine")) });
    actAs(owner);
    const res = await call(commentRoute.PATCH, "PATCH", { ...tp(), commentId: c.json.id }, { body: { body: doc(text("owner's words")), version: c.json.version } });
    expect(res.status).toBe(403);
  });

  it("an edit from a stale version answers 409", async () => {
    actAs(dyer);
    const c = await post({ body: doc(text("first")) });
    const p = { ...tp(), commentId: c.json.id };
    const a = await call(commentRoute.PATCH, "PATCH", p, { body: { body: doc(text("second")), version: c.json.version } });
    expect(a.status).toBe(200);
    expect(a.json.version).toBe(c.json.version + 1);
    const b = await call(commentRoute.PATCH, "PATCH", p, { body: { body: doc(text("third")), version: c.json.version } });
    expect(b.status).toBe(409);
    expect(b.json.error).toMatch(/changed since you opened it/);
  });

  it("canEdit and canDelete follow the caller", async () => {
    actAs(dyer);
    const c = await post({ body: doc(text("flags")) });
    expect(c.json.canEdit).toBe(true);
    actAs(guest);
    const asGuest = (await list()).json.find((x: { id: string }) => x.id === c.json.id);
    expect([asGuest.canEdit, asGuest.canDelete]).toEqual([false, false]);
    actAs(owner);
    const asOwner = (await list()).json.find((x: { id: string }) => x.id === c.json.id);
    expect([asOwner.canEdit, asOwner.canDelete]).toEqual([false, true]);
  });
});
