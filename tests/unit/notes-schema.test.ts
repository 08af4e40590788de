// Trial notes are checked against what the notes editor (tiptap StarterKit, level-3 headings) makes.
import { describe, expect, it } from "vitest";
import { notesDoc } from "@/lib/schemas/notes";
import { trialPatch } from "@/lib/schemas/trial";

const t = (text: string, marks?: unknown[]) => ({ type: "text", text, ...(marks ? { marks } : {}) });
const p = (...content: unknown[]) => ({ type: "paragraph", content });

// The shape the editor's getJSON() gives for a note using every tool it has (attributes included).
const richNote = {
  type: "doc",
  content: [
    { type: "heading", attrs: { level: 3 }, content: [t("Second layer")] },
    p(t("Steam "), t("30 min", [{ type: "bold" }]), t(", then rest "), t("overnight", [{ type: "italic" }, { type: "underline" }])),
    {
      type: "bulletList",
      content: [
        { type: "listItem", content: [p(t("Rinse until clear"))] },
        { type: "listItem", content: [p(t("pH "), t("4.5", [{ type: "code" }])), { type: "orderedList", attrs: { start: 1, type: null }, content: [{ type: "listItem", content: [p(t("nested"))] }] }] },
      ],
    },
    { type: "blockquote", content: [p(t("Old lot looked "), t("greener", [{ type: "strike" }]))] },
    { type: "codeBlock", attrs: { language: null }, content: [t("2.0 g in 200 ml")] },
    { type: "horizontalRule" },
    p(t("See "), t("the data sheet", [{ type: "link", attrs: { href: "https://example.com/sds.pdf", target: "_blank", rel: "noopener noreferrer nofollow", class: null } }]), { type: "hardBreak" }, t("done")),
    { type: "paragraph" },
  ],
};

const problem = (doc: unknown) => {
  const r = notesDoc.safeParse(doc);
  return r.success ? null : r.error.issues[0].message;
};

describe("notes", () => {
  it("take everything the editor makes, and an empty note", () => {
    expect(problem(richNote)).toBeNull();
    expect(problem({ type: "doc", content: [{ type: "paragraph" }] })).toBeNull();
    expect(trialPatch.safeParse({ version: 1, notes: richNote }).success).toBe(true);
    expect(trialPatch.safeParse({ version: 1, notes: null }).success).toBe(true);
  });

  it("refuse nodes and marks the editor cannot make", () => {
    expect(problem({ type: "doc", content: [{ type: "script", content: [t("alert(1)")] }] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: [{ type: "iframe", attrs: { src: "https://example.com" } }] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: [p(t("x", [{ type: "highlight" }]))] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: [{ type: "doc", content: [] }] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: [p({ type: "text", text: "" })] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: [p({ type: "text", text: "a", content: [t("b")] })] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: [{ type: "heading", attrs: { level: 9 }, content: [t("h")] }] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: "text" })).toMatch(/text, headings, lists/);
    expect(problem({ type: "paragraph" })).toBe("Notes must come from the notes editor.");
    expect(problem("notes")).toBe("Notes must come from the notes editor.");
  });

  it("refuse links that are not http(s) or mailto, and attributes that are not plain values", () => {
    const link = (href: unknown) => ({ type: "doc", content: [p(t("x", [{ type: "link", attrs: { href } }]))] });
    expect(problem(link("javascript:alert(1)"))).toMatch(/http:\/\/, https:\/\/ or mailto:/);
    expect(problem(link("data:text/html,<b>x</b>"))).toMatch(/http:\/\/, https:\/\/ or mailto:/);
    expect(problem(link(42))).toMatch(/http:\/\/, https:\/\/ or mailto:/);
    expect(problem(link("mailto:dyer@example.com"))).toBeNull();
    expect(problem({ type: "doc", content: [{ type: "paragraph", attrs: { style: { color: "red" } } }] })).toMatch(/text, headings, lists/);
    expect(problem({ type: "doc", content: [{ type: "paragraph", attrs: { title: "x".repeat(2001) } }] })).toMatch(/text, headings, lists/);
  });

  it("refuse nesting past 40 levels and documents over 100 000 characters of JSON", () => {
    let deep: unknown = p(t("bottom"));
    for (let i = 0; i < 25; i++) deep = { type: "bulletList", content: [{ type: "listItem", content: [deep] }] };
    expect(problem({ type: "doc", content: [deep] })).toBe("The notes are nested too deeply.");
    const long = { type: "doc", content: Array.from({ length: 2000 }, () => p(t("x".repeat(60)))) };
    expect(problem(long)).toMatch(/too long/);
  });
});
