// The trial list against the real database: ~30 trials with known bases, dyes, methods, tags,
// authors, statuses and dates; every filter, the search, the sorts and the pages checked.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import * as facetsRoute from "@/app/api/studios/[studioId]/trials/facets/route";
import { getOrm } from "@/lib/db";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { dosDye, makeBase, makeDye, makeTrial } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "trials-list";
const N = 30;
let owner: Person;
let dyer: Person;
let guest: Person;
let studio: StudioFixture;
let other: StudioFixture;
let bases: string[];
let dyes: string[];
const METHODS = ["immersion", "dip", "speckle"] as const;
const STATUSES = ["planned", "in-progress", "done"] as const;

interface Made {
  id: string;
  i: number;
  title: string;
}
const made: Made[] = [];

/** Day i of May 2026, noon UTC. */
const day = (i: number) => new Date(Date.UTC(2026, 4, 1 + i, 12));

beforeAll(async () => {
  [owner, dyer, guest] = await Promise.all([makeUser(TAG, "owner"), makeUser(TAG, "dyer"), makeUser(TAG, "guest")]);
  studio = await makeStudio("List Studio", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"]]);
  const stranger = await makeUser(TAG, "stranger");
  other = await makeStudio("Other List Studio", [[stranger, "owner"]]);
  bases = [await makeBase(studio.id, "Merino Fingering"), await makeBase(studio.id, "Mohair Lace")];
  dyes = [
    await makeDye(studio.id, "Cobalt Wash", { displayHex: "#2a4f9c" }),
    await makeDye(studio.id, "Saffron Drop", { displayHex: "#e0a526" }),
    await makeDye(studio.id, "Ink 50%_off", { displayHex: "#222222" }),
  ];
  // Trial i: base i%2, dye i%3, method i%3, status i%3, author owner when i%4==0 else dyer,
  // tag "gradient" when i%5==0, created on day i (May 1 + i), updated on day 40 - i.
  for (let i = 0; i < N; i++) {
    const title = `Trial ${String(i).padStart(2, "0")} ${i % 7 === 0 ? "Heron" : "Plain"}`;
    const id = await makeTrial(studio.id, {
      title,
      authorId: i % 4 === 0 ? owner.id : dyer.id,
      baseId: bases[i % 2],
      status: STATUSES[i % 3],
      tags: i % 5 === 0 ? ["gradient", "wip"] : ["wip"],
      notesText: i === 11 ? "The bath never cleared: kelp-coloured water left" : "",
      createdAt: day(i),
      updatedAt: day(40 - i),
      layers: [{ method: METHODS[i % 3], dyes: [dosDye(dyes[i % 3], 1)] }],
    });
    made.push({ id, i, title });
  }
  // A trial in another studio that matches everything: never listed here.
  await makeTrial(other.id, { title: "Trial 99 Heron", authorId: stranger.id, createdAt: day(3) });
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

async function list(qs: string) {
  actAs(guest);
  const res = await trialsRoute.GET(new Request(`http://127.0.0.1/api?${qs}`), { params: Promise.resolve({ studioId: studio.id }) });
  expect(res.status).toBe(200);
  return res.json();
}

const ids = (pred: (m: Made) => boolean) => made.filter(pred).map((m) => m.id).sort();
const sortedIds = (items: { id: string }[]) => items.map((t) => t.id).sort();

describe("pages", () => {
  it("20 per page by default, newest update first, total counts everything", async () => {
    const p1 = await list("");
    expect(p1.total).toBe(N);
    expect(p1.items).toHaveLength(20);
    expect(p1.page).toBe(1);
    expect(p1.pageSize).toBe(20);
    // Updated on day 40 - i: trial 0 is the most recently updated.
    expect(p1.items.map((t: { id: string }) => t.id)).toEqual(made.slice(0, 20).map((m) => m.id));
    const p2 = await list("page=2");
    expect(p2.items.map((t: { id: string }) => t.id)).toEqual(made.slice(20).map((m) => m.id));
    const p3 = await list("page=3");
    expect(p3.items).toEqual([]);
    expect(p3.total).toBe(N);
  });

  it("page size 7: four full pages and two left over, no trial twice", async () => {
    const seen: string[] = [];
    for (let p = 1; p <= 5; p++) {
      const r = await list(`pageSize=7&page=${p}`);
      expect(r.items).toHaveLength(p < 5 ? 7 : 2);
      seen.push(...r.items.map((t: { id: string }) => t.id));
    }
    expect(new Set(seen).size).toBe(N);
  });
});

describe("sorts", () => {
  it("created ascending and descending", async () => {
    const asc = await list("sort=created&dir=asc&pageSize=100");
    expect(asc.items.map((t: { id: string }) => t.id)).toEqual(made.map((m) => m.id));
    const desc = await list("sort=created&pageSize=100");
    expect(desc.items.map((t: { id: string }) => t.id)).toEqual([...made].reverse().map((m) => m.id));
  });

  it("title ascending by default, descending on request", async () => {
    const byTitle = [...made].sort((a, b) => a.title.toLowerCase().localeCompare(b.title.toLowerCase()));
    const asc = await list("sort=title&pageSize=100");
    expect(asc.items.map((t: { title: string }) => t.title)).toEqual(byTitle.map((m) => m.title));
    const desc = await list("sort=title&dir=desc&pageSize=5");
    expect(desc.items.map((t: { title: string }) => t.title)).toEqual([...byTitle].reverse().slice(0, 5).map((m) => m.title));
  });
});

describe("filters", () => {
  it.each([
    ["base", () => `baseId=${bases[1]}`, (m: Made) => m.i % 2 === 1],
    ["dye", () => `dyeId=${dyes[2]}`, (m: Made) => m.i % 3 === 2],
    ["method", () => "method=speckle", (m: Made) => m.i % 3 === 2],
    ["tag", () => "tag=gradient", (m: Made) => m.i % 5 === 0],
    ["tag, any case", () => "tag=Gradient", (m: Made) => m.i % 5 === 0],
    ["author", () => `authorId=${owner.id}`, (m: Made) => m.i % 4 === 0],
    ["status", () => "status=in-progress", (m: Made) => m.i % 3 === 1],
    ["from", () => "from=2026-05-26", (m: Made) => m.i >= 25],
    ["to", () => "to=2026-05-03", (m: Made) => m.i <= 2],
    ["date range", () => "from=2026-05-10&to=2026-05-12", (m: Made) => m.i >= 9 && m.i <= 11],
    ["base and status", () => `baseId=${bases[0]}&status=done`, (m: Made) => m.i % 2 === 0 && m.i % 3 === 2],
  ])("%s", async (_n, qs, pred) => {
    const r = await list(`${qs()}&pageSize=100`);
    const want = ids(pred);
    expect(want.length).toBeGreaterThan(0);
    expect(want.length).toBeLessThan(N);
    expect(r.total).toBe(want.length);
    expect(sortedIds(r.items)).toEqual(want);
  });

  it("a filter with a page: the total stays the whole match", async () => {
    const r = await list("method=dip&pageSize=3&page=2");
    expect(r.total).toBe(10);
    expect(r.items).toHaveLength(3);
  });
});

describe("search", () => {
  it.each([
    ["title", "heron", (m: Made) => m.i % 7 === 0],
    ["base name", "mohair", (m: Made) => m.i % 2 === 1],
    ["dye name", "saffron", (m: Made) => m.i % 3 === 1],
    ["notes text", "kelp-coloured", (m: Made) => m.i === 11],
    ["two words, both must match", "heron cobalt", (m: Made) => m.i % 7 === 0 && m.i % 3 === 0],
    ["a wildcard is literal", "50%_", (m: Made) => m.i % 3 === 2],
  ])("%s", async (_n, q, pred) => {
    const r = await list(`q=${encodeURIComponent(q)}&pageSize=100`);
    expect(sortedIds(r.items)).toEqual(ids(pred));
  });

  it("a percent sign alone matches only text with one", async () => {
    const r = await list(`q=${encodeURIComponent("%")}&pageSize=100`);
    expect(sortedIds(r.items)).toEqual(ids((m) => m.i % 3 === 2));
  });
});

describe("rows", () => {
  it("carry the dyes' display colours, the methods, the base and the author", async () => {
    const r = await list("sort=created&dir=asc&pageSize=2");
    expect(r.items[1]).toMatchObject({
      title: made[1].title,
      base: { id: bases[1], name: "Mohair Lace" },
      author: { id: dyer.id },
      layerCount: 1,
      methods: ["dip"],
      dyes: [{ dyeId: dyes[1], name: "Saffron Drop", displayHex: "#e0a526" }],
      status: "in-progress",
    });
  });

  it("sum up several layers: each method and dye once, in layer order; another studio's dye shows as removed", async () => {
    const s = await makeStudio("Layered List Studio", [[owner, "owner"]]);
    const alder = await makeDye(s.id, "Alder Rust", { displayHex: "#8a3b1f" });
    const birch = await makeDye(s.id, "Birch Pale");
    const copper = await makeDye(s.id, "Copper Deep", { displayHex: "#b0642a" });
    const foreign = dyes[0];
    await makeTrial(s.id, {
      title: "Three layers",
      authorId: owner.id,
      layers: [
        { method: "kettle", dyes: [dosDye(birch, 1), dosDye(alder, 1)] },
        { method: "dip", dyes: [dosDye(copper, 1), dosDye(birch, 2), dosDye(foreign, 1)] },
        { method: "kettle", dyes: [dosDye(alder, 0.5)] },
      ],
    });
    await makeTrial(s.id, { title: "No layers yet", authorId: owner.id });
    actAs(owner);
    const res = await trialsRoute.GET(new Request("http://127.0.0.1/api?sort=title"), { params: Promise.resolve({ studioId: s.id }) });
    const { items, total } = await res.json();
    expect(total).toBe(2);
    expect(items[0]).toMatchObject({ title: "No layers yet", layerCount: 0, methods: [], dyes: [], base: null });
    expect(items[1]).toMatchObject({
      title: "Three layers",
      author: { id: owner.id },
      layerCount: 3,
      methods: ["kettle", "dip"],
      dyes: [
        { dyeId: birch, name: "Birch Pale", displayHex: null },
        { dyeId: alder, name: "Alder Rust", displayHex: "#8a3b1f" },
        { dyeId: copper, name: "Copper Deep", displayHex: "#b0642a" },
        { dyeId: foreign, name: "Removed dye", displayHex: null },
      ],
    });
  });

  it("facets list the studio's bases, dyes, tags and authors", async () => {
    actAs(guest);
    const f = await call(facetsRoute.GET, "GET", { studioId: studio.id });
    expect(f.status).toBe(200);
    expect(f.json.bases.map((b: { name: string }) => b.name)).toEqual(["Merino Fingering", "Mohair Lace"]);
    expect(f.json.dyes.map((d: { name: string }) => d.name)).toEqual(["Cobalt Wash", "Ink 50%_off", "Saffron Drop"]);
    expect(f.json.tags).toEqual(["gradient", "wip"]);
    expect(f.json.authors.map((a: { id: string }) => a.id).sort()).toEqual([owner.id, dyer.id].sort());
  });
});
