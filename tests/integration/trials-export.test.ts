// CSV export of the trial list: headers, one row per layer, the list's filters, RFC 4180 quoting
// and the formula-injection guard.
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as exportRoute from "@/app/api/studios/[studioId]/trials/export/route";
import * as layersRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/route";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import { getOrm } from "@/lib/db";
import { CSV_HEADER, csvCell } from "@/lib/trials/csv";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { makeBase, makeDye, makeStock } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "trials-export";
let dyer: Person;
let guest: Person;
let studio: StudioFixture;
let trialId: string;

const TRICKY_TITLE = 'Moss "second go", dip\nline two';
const FORMULA_OBS = "=HYPERLINK(\"http://example.invalid\",\"click\")";

beforeAll(async () => {
  [dyer, guest] = await Promise.all([makeUser(TAG, "dyer", { name: "Ada Dyer" }), makeUser(TAG, "guest")]);
  studio = await makeStudio("Export Studio", [[dyer, "dyer"], [guest, "guest"]]);
  const base = await makeBase(studio.id, "Export Base, DK");
  const dye = await makeDye(studio.id, "Moss");
  const stock = await makeStock(studio.id, dye, { pct: 1 });
  actAs(dyer);
  const t = await call(trialsRoute.POST, "POST", { studioId: studio.id }, {
    body: { title: TRICKY_TITLE, fibreWeightG: 454, baseId: base, tags: ["moss", "+plus"], status: "done" },
  });
  trialId = t.json.id;
  await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, {
    body: { method: "dip", waterL: 4.54, temperatureC: 88, dyes: [{ dyeId: dye, stockId: stock, amount: { value: 2, unit: "dos" } }], acid: { kind: "vinegar", amount: 236, ph: 4.8 } },
  });
  await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, {
    body: { method: "dry", coverage: 0.3, observations: FORMULA_OBS, rinseNote: "-bled a little, @sink", bled: true },
  });
  await call(trialsRoute.POST, "POST", { studioId: studio.id }, { body: { title: "Empty planned trial", fibreWeightG: 100 } });
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

async function exportCsv(qs = "") {
  actAs(guest);
  const res = await exportRoute.GET(new Request(`http://127.0.0.1/api?${qs}`), { params: Promise.resolve({ studioId: studio.id }) });
  const bytes = new Uint8Array(await res.arrayBuffer());
  // Response.text() would drop the byte-order mark; keep it to check it is there.
  return { res, bytes, text: new TextDecoder("utf-8", { ignoreBOM: true }).decode(bytes) };
}

describe("csvCell", () => {
  it.each([
    ["plain", "Moss", "Moss"],
    ["comma", "a,b", '"a,b"'],
    ["quote", 'say "hi"', '"say ""hi"""'],
    ["newline", "one\ntwo", '"one\ntwo"'],
    ["carriage return", "one\rtwo", '"one\rtwo"'],
    ["equals", "=1+1", "'=1+1"],
    ["plus", "+1", "'+1"],
    ["minus", "-1", "'-1"],
    ["at", "@SUM(A1)", "'@SUM(A1)"],
    ["tab", "\t=1", "'\t=1"],
    ["formula with a comma", "=SUM(1,2)", '"\'=SUM(1,2)"'],
  ])("%s", (_n, input, out) => {
    expect(csvCell(input)).toBe(out);
  });

  it("writes numbers as numbers (a negative temperature is not a formula), booleans as yes/no, empty for null", () => {
    expect(csvCell(-5)).toBe("-5");
    expect(csvCell(0.098578431875)).toBe("0.0986");
    expect(csvCell(true)).toBe("yes");
    expect(csvCell(null)).toBe("");
  });
});

describe("GET /trials/export", () => {
  it("is a CSV download with a byte-order mark and CRLF line ends", async () => {
    const { res, text } = await exportCsv();
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="trials-\d{4}-\d{2}-\d{2}\.csv"$/);
    const { bytes } = await exportCsv();
    expect([...bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    expect(text.startsWith("\uFEFF")).toBe(true);
    expect(text.endsWith("\r\n")).toBe(true);
    expect(text.split("\r\n")[0]).toBe("\uFEFF" + CSV_HEADER.join(","));
  });

  it("one row per layer, quoted and guarded, read back by a CSV parser", async () => {
    const { text } = await exportCsv("sort=created&dir=asc");
    const parsed = Papa.parse<string[]>(text.slice(1), { newline: "\r\n", skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...rows] = parsed.data;
    expect(header).toEqual(CSV_HEADER);
    expect(rows).toHaveLength(3); // two layers of the first trial, one empty row for the second
    const col = (name: string) => CSV_HEADER.indexOf(name);
    const [dip, dry, empty] = rows;
    expect(dip[col("Trial")]).toBe(TRICKY_TITLE);
    expect(dip[col("Base")]).toBe("Export Base, DK");
    expect(dip[col("Author")]).toBe("Ada Dyer");
    expect(dip[col("Status")]).toBe("Done");
    expect(dip[col("Tags")]).toBe("moss; +plus");
    expect(dip[col("Layer")]).toBe("1");
    expect(dip[col("Method")]).toBe("Dip / gradient");
    // 454 g at 2 % with 1 % stock: 9.08 g, 908 ml (DOMAIN.md check value, common practice).
    expect(dip[col("Dyes")]).toBe("Moss 2 % (9.08 g; 908 ml of 1 % stock)");
    expect(dip[col("Acid")]).toBe("236 ml vinegar, pH 4.8");
    expect(dip[col("Liquor ratio (1:N)")]).toBe("10");
    expect(dip[col("Temperature (°C)")]).toBe("88");
    expect(dry[col("Layer")]).toBe("2");
    expect(dry[col("Coverage")]).toBe("0.3");
    expect(dry[col("Observations")]).toBe(`'${FORMULA_OBS}`);
    expect(dry[col("Rinse note")]).toBe("'-bled a little, @sink");
    expect(dry[col("Bled")]).toBe("yes");
    expect(dry[col("Trial id")]).toBe(trialId);
    expect(empty[col("Trial")]).toBe("Empty planned trial");
    expect(empty[col("Layer")]).toBe("");
    expect(empty).toHaveLength(CSV_HEADER.length);
    // The raw text: the title's quote doubled, the whole cell quoted.
    expect(text).toContain('"Moss ""second go"", dip\nline two"');
    // A tag starting with + inside a joined cell is not at the cell's start: left as is.
    expect(text).toContain(",moss; +plus,");
  });

  it("applies the list's filters", async () => {
    const { text } = await exportCsv("status=planned");
    const rows = Papa.parse<string[]>(text.slice(1), { newline: "\r\n", skipEmptyLines: true }).data;
    expect(rows).toHaveLength(2);
    expect(rows[1][0]).toBe("Empty planned trial");
    const bad = await exportCsv("status=soaking");
    expect(bad.res.status).toBe(422);
  });
});
