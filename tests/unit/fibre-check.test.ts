// fibreWarnings: which fibres a dye class leaves pale, and the care notes for wool.
// The rules checked here are DOMAIN.md "Fibres and dye classes" (common practice): acid dyes and
// food colouring dye protein fibres and nylon, not cellulose, acrylic or polyester; fibre-reactive
// dyes are for cellulose, protein with caveats; nylon saturates sooner than wool; superwash wool
// strikes fast and long boiling harms it; non-superwash wool felts.
import { describe, expect, it } from "vitest";
import type { FibrePart } from "@/entities/library";
import { fibreGroup, fibreWarnings } from "@/lib/library/fibre-check";

const kinds = (ws: { kind: string }[]) => ws.map((w) => w.kind);

describe("fibreWarnings", () => {
  const woolCotton: FibrePart[] = [{ fibre: "wool", pct: 70 }, { fibre: "cotton", pct: 30 }];

  it("the 30 % cotton stays pale with acid dyes", () => {
    const ws = fibreWarnings(woolCotton, "acid");
    const pale = ws.find((w) => w.kind === "wont-take");
    expect(pale?.message).toBe("The 30 % cotton will stay pale: acid dyes do not dye cellulose.");
    expect(pale?.fibres).toEqual(["cotton"]);
    expect(pale?.level).toBe("warning");
  });

  it("food colouring is treated as the acid-dye blend it is", () => {
    const pale = fibreWarnings(woolCotton, "food").find((w) => w.kind === "wont-take");
    expect(pale?.message).toMatch(/^The 30 % cotton will stay pale: food colouring \(a blend of acid dyes\) does not dye cellulose/);
  });

  it("several cellulose fibres are named together, synthetic ones separately", () => {
    const ws = fibreWarnings(
      [{ fibre: "wool", pct: 50 }, { fibre: "linen", pct: 20 }, { fibre: "bamboo", pct: 15 }, { fibre: "polyester", pct: 15 }],
      "acid",
    );
    const msgs = ws.filter((w) => w.kind === "wont-take").map((w) => w.message);
    expect(msgs).toEqual([
      "The 20 % linen and 15 % bamboo will stay pale: acid dyes do not dye cellulose.",
      "The 15 % polyester will stay pale: acid dyes do not dye polyester.",
    ]);
  });

  it("an all-cotton base stays undyed with acid dyes", () => {
    const ws = fibreWarnings([{ fibre: "cotton", pct: 100 }], "acid");
    expect(ws).toHaveLength(1);
    expect(ws[0].message).toBe("This base will stay undyed: acid dyes do not dye cellulose.");
  });

  it("pure wool with acid dye has no fibre warning, only the felting note", () => {
    expect(kinds(fibreWarnings([{ fibre: "wool", pct: 100 }], "acid"))).toEqual(["felting"]);
  });

  it("pure silk with acid dye: nothing at all (silk does not felt)", () => {
    expect(fibreWarnings([{ fibre: "silk", pct: 100 }], "acid")).toEqual([]);
  });

  it("a superwash merino/nylon sock base: nylon unevenness and the superwash note, no felting note", () => {
    const ws = fibreWarnings([{ fibre: "merino", pct: 75 }, { fibre: "nylon", pct: 25 }], "acid", { superwash: true });
    expect(kinds(ws)).toEqual(["uneven", "superwash"]);
    expect(ws[0].message).toMatch(/^The 25 % nylon takes up dye sooner than the wool/);
    expect(ws[1].message).toBe("Superwash wool strikes fast and bright; long boiling harms it.");
  });

  it("the fibre 'superwash wool' brings the superwash note without the flag", () => {
    expect(kinds(fibreWarnings([{ fibre: "superwash wool", pct: 100 }], "acid"))).toEqual(["superwash"]);
  });

  it("a superwash flag on a base with no wool (pure nylon) adds no wool note", () => {
    expect(fibreWarnings([{ fibre: "nylon", pct: 100 }], "acid", { superwash: true })).toEqual([]);
  });

  it("fibre-reactive dye: fine on cotton, a caveat on wool, pale on acrylic", () => {
    expect(fibreWarnings([{ fibre: "cotton", pct: 100 }], "reactive")).toEqual([]);
    const ws = fibreWarnings([{ fibre: "wool", pct: 60 }, { fibre: "acrylic", pct: 40 }], "reactive");
    expect(kinds(ws)).toEqual(["wont-take", "caveat", "felting"]);
    expect(ws[0].message).toBe("The 40 % acrylic will stay pale: fibre-reactive dyes do not dye acrylic.");
    expect(ws[1].message).toMatch(/on the 60 % wool they work only with the maker's protein-fibre method/);
  });

  it("nylon unevenness is about acid-type dyes only", () => {
    expect(kinds(fibreWarnings([{ fibre: "wool", pct: 80 }, { fibre: "nylon", pct: 20 }], "reactive"))).not.toContain("uneven");
  });

  it("an 'other' dye class or an 'other' fibre makes no claims", () => {
    expect(kinds(fibreWarnings(woolCotton, "other"))).toEqual(["felting"]);
    expect(fibreWarnings([{ fibre: "other", pct: 100 }], "acid")).toEqual([]);
  });

  it("fractional shares are printed to one decimal", () => {
    const pale = fibreWarnings([{ fibre: "wool", pct: 66.67 }, { fibre: "cotton", pct: 33.33 }], "acid")[0];
    expect(pale.message).toMatch(/^The 33.3 % cotton/);
  });

  it("groups every listed fibre", () => {
    expect(["wool", "silk", "yak"].map((f) => fibreGroup(f as never))).toEqual(["protein", "protein", "protein"]);
    expect(["cotton", "viscose", "nylon", "acrylic", "polyester", "other"].map((f) => fibreGroup(f as never))).toEqual([
      "cellulose", "cellulose", "nylon", "acrylic", "polyester", "unknown",
    ]);
  });
});
