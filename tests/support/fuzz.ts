// Request bodies for fuzzing the write routes: shapes read from a route's zod schema (through
// zod's own JSON Schema export), with hostile values mixed in at every node — huge strings, deep
// nesting, wrong types, awkward unicode, numbers at the edges, extra keys, arrays for objects, null.
// Bodies are written with toJson, which can also emit text JSON.stringify cannot (-0, 1e400,
// integers past 2^53, nesting deeper than its own stack allows).
import fc from "fast-check";
import { z } from "zod";

/** JSON text placed into a body as-is. */
export class Raw {
  constructor(readonly text: string) {}
}

/** Serialises a generated body; Raw values go in verbatim. */
export function toJson(v: unknown): string {
  if (v instanceof Raw) return v.text;
  if (v === undefined) return "null";
  if (Array.isArray(v)) return `[${v.map(toJson).join(",")}]`;
  if (v && typeof v === "object") {
    return `{${Object.entries(v)
      .filter(([, x]) => x !== undefined)
      .map(([k, x]) => `${JSON.stringify(k)}:${toJson(x)}`)
      .join(",")}}`;
  }
  return JSON.stringify(v) ?? "null";
}

/** An object with an own property of any name, "__proto__" included. */
function withKey(o: Record<string, unknown>, k: string, v: unknown): Record<string, unknown> {
  Object.defineProperty(o, k, { value: v, enumerable: true, writable: true, configurable: true });
  return o;
}

const deep = (depth: number, open: string, close: string, inner = "1") => new Raw(open.repeat(depth) + inner + close.repeat(depth));

/**
 * Any code points, lone surrogates and NUL included. (Built from integers: fast-check's own
 * full-range string units build a million-entry lookup table per use, which dominated the run.)
 */
const anyCodePoints = fc.array(fc.integer({ min: 0, max: 0x10ffff }), { maxLength: 30 }).map((cps) => String.fromCodePoint(...cps));

/**
 * Web addresses and e-mail addresses, built from patterns: fast-check's own webUrl and
 * emailAddress build a large lookup table each time they are made.
 */
export const webUrl = fc
  .tuple(fc.constantFrom("https://", "http://"), fc.stringMatching(/^[a-z0-9-]{1,12}\.(test|example|org)$/), fc.stringMatching(/^(\/[a-zA-Z0-9._~-]{0,8}){0,3}(\?[a-z]=[0-9]{1,3})?$/))
  .map(([scheme, host, rest]) => scheme + host + rest);
export const emailAddress = fc
  .tuple(fc.stringMatching(/^[a-zA-Z0-9._%+-]{1,16}$/), fc.stringMatching(/^[a-z0-9-]{1,12}\.(test|example)$/))
  .map(([local, host]) => `${local}@${host}`);

/** Strings a parser, a database or a page may choke on. */
export const nastyString = fc.oneof(
  fc.constantFrom(
    "",
    " ",
    "   \t\n ",
    "\u0000",
    "a\u0000b",
    "\ud800",
    "x\udfffy",
    "\ud83e",
    "\u202eevil\u202c",
    "\u0645\u0631\u062d\u0628\u0627 \u05e9\u05dc\u05d5\u05dd",
    "🧶🎨👩‍👩‍👧🏳️‍🌈",
    "\ufeffbom",
    "zero\u200bwidth",
    "e\u0301\u0301\u0301\u0301",
    "'); drop table trials; --",
    "<script>alert(1)</script>",
    "${7*7}{{7*7}}",
    "../../etc/passwd",
    "%00%ff",
    "null",
    "NaN",
    "-Infinity",
    "1e308",
    "__proto__",
    "constructor",
    "2026-02-30",
    "0000-00-00",
    "#GGGGGG",
    "javascript:alert(1)",
  ),
  anyCodePoints,
);

/** Strings of 100 kB or more, made once (building and escaping them per run would dominate the run). */
const HUGE = (["x", "é", "🧶", "\u202e"] as const).map((unit, i) =>
  // Joined rather than repeated: a flat string, quick to send again and again.
  Array.from({ length: Math.ceil((100_001 + i * 3_000) / unit.length) }, () => unit).join(""),
);
export const hugeString = fc.constantFrom(...HUGE);
/** The same strings as JSON text, for bodies. */
const hugeJson = fc.constantFrom(...HUGE.map((h) => new Raw(JSON.stringify(h))));

/** Numbers at the edges, some only expressible as raw JSON text. */
export const edgeNumber = fc.oneof(
  fc.constantFrom<unknown>(
    1e308,
    -1e308,
    Number.MAX_SAFE_INTEGER,
    -Number.MAX_SAFE_INTEGER,
    2 ** 31,
    -(2 ** 31) - 1,
    2 ** 53,
    5e-324,
    -1,
    0,
    0.5,
    1.5,
    -0.000001,
    100.0000001,
    new Raw("-0"),
    new Raw("9007199254740993"),
    new Raw("1e400"),
    new Raw("-1e400"),
    new Raw("1E-400"),
    new Raw("123456789012345678901234567890"),
  ),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer({ min: -1_000_000, max: 1_000_000 }),
);

/** A flat copy of a string (one built by repeat and concatenation is a rope, slow to use each time). */
const flat = (text: string) => Buffer.from(text, "utf8").toString("utf8");

/** Nesting far past anything the app stores (V8's own recursion gives out near 10 000 levels); made once. */
const DEEP = [65, 300, 3_000, 12_000].flatMap((d) => [
  new Raw(flat(deep(d, "[", "]").text)),
  new Raw(flat(deep(d, '{"a":', "}").text)),
  // Shaped like an editor document on the outside.
  new Raw(flat(`{"type":"doc","content":[${deep(Math.min(d, 3_000), '{"type":"bulletList","content":[', "]}", '{"type":"text","text":"x"}').text}]}`)),
]);
export const deepValue = fc.constantFrom(...DEEP);

/** Values too big for any field: 100 kB+ strings, deep nesting, very long arrays, very wide objects. */
export const heavy: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: hugeJson },
  { weight: 3, arbitrary: deepValue },
  {
    weight: 1,
    arbitrary: fc.constantFrom<unknown>(
      new Raw(flat(`[${"1,".repeat(50_000)}1]`)),
      new Raw(flat(`[${'"x",'.repeat(20_000)}"x"]`)),
      new Raw(`{${Array.from({ length: 5_000 }, (_, i) => `"k${i}":${i}`).join(",")}}`),
    ),
  },
);

/** A value of the wrong kind for almost any field (small: see `heavy` for the big ones). */
export const hostile: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: nastyString },
  { weight: 3, arbitrary: edgeNumber },
  { weight: 1, arbitrary: fc.constantFrom(...[20, 40, 80].map((d) => new Raw(flat(deep(d, "[", "]").text)))) },
  {
    weight: 3,
    arbitrary: fc.constantFrom<unknown>(
      null,
      true,
      false,
      {},
      [],
      [null],
      [{}],
      [1, 2, 3],
      { type: "doc" },
      new Raw('{"__proto__":{"polluted":true}}'),
      new Raw('{"constructor":{"prototype":{"polluted":true}}}'),
    ),
  },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 2 }) },
);

/** A copy of plain arrays and objects (own "__proto__" keys included); Raw and scalars as they are. */
function clone(v: unknown): unknown {
  if (v instanceof Raw || !v || typeof v !== "object") return v;
  if (Array.isArray(v)) return v.map(clone);
  const out: Record<string, unknown> = {};
  for (const [k, x] of Object.entries(v)) withKey(out, k, clone(x));
  return out;
}

/** Puts `v` in place of one leaf of `body` (picked by `at`), or adds it under an odd key. */
function plant(original: unknown, v: unknown, at: number): unknown {
  const body = clone(original); // generated values may share constants; never change those
  const leaves: { parent: Record<string, unknown> | unknown[]; key: string | number }[] = [];
  const walk = (node: unknown) => {
    if (node instanceof Raw || !node || typeof node !== "object") return;
    for (const [k, x] of Object.entries(node)) {
      if (x && typeof x === "object" && !(x instanceof Raw)) walk(x);
      else leaves.push({ parent: node as Record<string, unknown>, key: Array.isArray(node) ? Number(k) : k });
    }
  };
  walk(body);
  if (!leaves.length) return body && typeof body === "object" && !Array.isArray(body) && !(body instanceof Raw) ? { ...body, extra: v } : v;
  const { parent, key } = leaves[at % leaves.length];
  (parent as Record<string | number, unknown>)[key] = v;
  return body;
}

/** Keys a careless handler might copy onto a record. */
const extraKeys = fc.constantFrom("__proto__", "constructor", "id", "studio", "studioId", "author", "createdBy", "archived", "version", "role", "createdAt", "x".repeat(2_000), "");

/** Overrides for named fields: real ids, current versions, dates. Keyed by the field's name. */
export type Hints = Record<string, fc.Arbitrary<unknown>>;

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type JS = any;

function numberArb(js: JS): fc.Arbitrary<unknown> {
  const int = js.type === "integer";
  const lo = typeof js.exclusiveMinimum === "number" ? js.exclusiveMinimum : js.minimum;
  const hi = typeof js.exclusiveMaximum === "number" ? js.exclusiveMaximum : js.maximum;
  const min = typeof lo === "number" && Math.abs(lo) < 1e12 ? lo : -1_000;
  const max = typeof hi === "number" && Math.abs(hi) < 1e12 ? hi : 25_000;
  const edges = [min, max, min - 1, max + 1, min - 0.001, max + 0.001, (min + max) / 2];
  return fc.oneof(
    { weight: 4, arbitrary: int ? fc.integer({ min: Math.ceil(min), max: Math.floor(max) }) : fc.double({ min, max, noNaN: true }) },
    { weight: 2, arbitrary: fc.constantFrom(...edges) },
    { weight: 1, arbitrary: int ? fc.double({ min, max, noNaN: true }) : fc.integer({ min: Math.ceil(min), max: Math.floor(max) }) },
  );
}

function stringArb(js: JS): fc.Arbitrary<unknown> {
  if (js.format === "uuid") return fc.uuid();
  if (js.format === "email") return fc.oneof(emailAddress, fc.constantFrom("a@b", "@x.test", "x@x.test ", " X@EXAMPLE.TEST", "a@b.test\u0000"));
  if (typeof js.pattern === "string") {
    return fc.oneof({ weight: 3, arbitrary: fc.stringMatching(new RegExp(js.pattern)) }, { weight: 1, arbitrary: fc.string({ maxLength: 12 }) });
  }
  const min = js.minLength ?? 0;
  const max = Math.min(js.maxLength ?? 200, 5_000);
  return fc.oneof(
    { weight: 5, arbitrary: fc.string({ minLength: min, maxLength: Math.min(max, 60) }) },
    { weight: 1, arbitrary: fc.constantFrom("x".repeat(max), "x".repeat(max + 1), " ".repeat(Math.max(min, 1)), ` ${"y".repeat(Math.max(min, 1))} `) },
    { weight: 1, arbitrary: anyCodePoints.filter((x) => x.length >= min) },
  );
}

function mergeAllOf(js: JS): JS {
  const out: JS = { type: "object", properties: {}, required: [] };
  for (const part of js.allOf) {
    Object.assign(out.properties, part.properties ?? {});
    out.required.push(...(part.required ?? []));
  }
  return out;
}

/** Values for one JSON Schema node; `hostileWeight` 0 gives schema-shaped values only. */
function fromJsonSchema(js: JS, path: string[], hints: Hints, hostileWeight: number): fc.Arbitrary<unknown> {
  const key = path[path.length - 1];
  const recur = (node: JS, sub: string[]) => fromJsonSchema(node, sub, hints, hostileWeight);
  let valid: fc.Arbitrary<unknown>;
  if (key !== undefined && hints[key]) valid = hints[key];
  else if (js.allOf) valid = recur(mergeAllOf(js), path);
  else if (js.anyOf) valid = fc.oneof(...js.anyOf.map((x: JS) => recur(x, path)));
  else if (js.enum) valid = fc.constantFrom(...js.enum);
  else if (js.const !== undefined) valid = fc.constant(js.const);
  else if (Array.isArray(js.type)) valid = fc.oneof(...js.type.map((t: string) => recur({ ...js, type: t }, path)));
  else {
    switch (js.type) {
      case "object": {
        const props: Record<string, JS> = js.properties ?? {};
        const names = Object.keys(props);
        const record = fc.record(Object.fromEntries(names.map((n) => [n, recur(props[n], [...path, n])])), {
          requiredKeys: (js.required ?? []).filter((n: string) => names.includes(n)),
        });
        valid = hostileWeight
          ? fc
              .tuple(
                record,
                fc.option(fc.array(fc.tuple(extraKeys, hostile), { minLength: 1, maxLength: 3 }), { freq: 6 }),
                fc.option(fc.constantFrom(...(names.length ? names : ["_"])), { freq: 8 }),
              )
              .map(([r, extra, drop]) => {
                const o = { ...(r as Record<string, unknown>) };
                if (drop) delete o[drop];
                for (const [k, v] of extra ?? []) withKey(o, k, v);
                return o;
              })
          : record;
        break;
      }
      case "array": {
        const min = js.minItems ?? 0;
        const max = Math.min(js.maxItems ?? 8, 200);
        const items = recur(js.items ?? {}, [...path, "[]"]);
        // Short lists mostly (generation cost grows with every item); one over the limit now and then.
        valid = fc.oneof(
          { weight: 5, arbitrary: fc.array(items, { minLength: min, maxLength: Math.max(min, Math.min(max, 3)) }) },
          { weight: 1, arbitrary: fc.array(items, { minLength: min, maxLength: max }) },
          { weight: hostileWeight ? 1 : 0, arbitrary: items.map((x) => Array.from({ length: max + 1 }, () => x)) },
        );
        break;
      }
      case "string":
        valid = stringArb(js);
        break;
      case "number":
      case "integer":
        valid = numberArb(js);
        break;
      case "boolean":
        valid = fc.boolean();
        break;
      case "null":
        valid = fc.constant(null);
        break;
      default:
        valid = fc.jsonValue({ maxDepth: 2 });
    }
  }
  return hostileWeight ? fc.oneof({ weight: 20, arbitrary: valid }, { weight: hostileWeight, arbitrary: hostile }) : valid;
}

/** Malformed or empty JSON text. */
const brokenJson = fc.oneof(
  fc.constantFrom("{", '{"a":}', "nul", "[1,]", "{'a':1}", "", "   ", "\u0000", '{"a":1}{"b":2}', '"just a string"', "12", "true", "[]", "null"),
  fc.string({ maxLength: 30 }),
);

export interface FuzzBody {
  /** The body text as sent. */
  text: string;
  kind: "valid" | "shaped" | "mixed" | "hostile" | "broken";
}

/**
 * Bodies for a route: some shaped by its schema only (most pass or fail on cross-field rules), most
 * mixed with hostile values, some wholly hostile, some not JSON at all.
 */
export function bodiesFor(schema: z.ZodType, hints: Hints = {}, valid?: fc.Arbitrary<unknown>): fc.Arbitrary<FuzzBody> {
  const js = z.toJSONSchema(schema, { io: "input", unrepresentable: "any" });
  const mixed = fc
    .tuple(fromJsonSchema(js, [], hints, 1), fc.option(heavy, { freq: 16 }), fc.nat())
    .map(([body, big, at]) => ({ text: toJson(big === null ? body : plant(body, big, at)), kind: "mixed" as const }));
  return fc.oneof(
    // Bodies meant to pass, where the schema has rules across fields that shapes alone rarely meet.
    { weight: valid ? 3 : 0, arbitrary: (valid ?? fc.constant({})).map((v) => ({ text: toJson(v), kind: "valid" as const })) },
    { weight: 3, arbitrary: fromJsonSchema(js, [], hints, 0).map((v) => ({ text: toJson(v), kind: "shaped" as const })) },
    { weight: 6, arbitrary: mixed },
    { weight: 1, arbitrary: fc.oneof({ weight: 2, arbitrary: hostile }, { weight: 1, arbitrary: heavy }).map((v) => ({ text: toJson(v), kind: "hostile" as const })) },
    { weight: 1, arbitrary: brokenJson.map((t) => ({ text: t, kind: "broken" as const })) },
  );
}

/** A placeholder for "the record's version now", filled in just before the call. */
export const CURRENT_VERSION = "__current_version__";
export const versionHint = fc.oneof(
  { weight: 5, arbitrary: fc.constant(CURRENT_VERSION) },
  { weight: 1, arbitrary: fc.integer({ min: -2, max: 50 }) },
  { weight: 1, arbitrary: edgeNumber },
);

/** Ids: mostly real ones (this studio's and another's), some random, some not ids at all. */
export function idHint(...ids: string[]): fc.Arbitrary<unknown> {
  return fc.oneof({ weight: 6, arbitrary: fc.constantFrom(...ids) }, { weight: 1, arbitrary: fc.uuid() }, { weight: 1, arbitrary: nastyString });
}
