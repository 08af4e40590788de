// Rich notes arrive as the editor's JSON document; search and CSV use its plain text.

interface DocNode {
  type?: string;
  text?: string;
  content?: DocNode[];
}

const BLOCKS = new Set(["paragraph", "heading", "listItem", "blockquote", "codeBlock", "hardBreak"]);

/** The document's text, blocks separated by newlines. */
export function notesText(doc: Record<string, unknown> | null | undefined): string {
  if (!doc) return "";
  const out: string[] = [];
  const walk = (n: DocNode) => {
    // The notes schema checks only the outer { type: "doc" }: anything may sit inside.
    if (!n || typeof n !== "object") return;
    if (typeof n.text === "string") out.push(n.text);
    if (Array.isArray(n.content)) n.content.forEach(walk);
    if (n.type && BLOCKS.has(n.type)) out.push("\n");
  };
  walk(doc as DocNode);
  return out.join("").replace(/\n{2,}/g, "\n").trim();
}

/** A one-paragraph document from plain text (seed data, tests). */
export function docFromText(text: string): Record<string, unknown> {
  return {
    type: "doc",
    content: text.split(/\n{2,}/).map((p) => ({ type: "paragraph", content: p ? [{ type: "text", text: p }] : [] })),
  };
}
