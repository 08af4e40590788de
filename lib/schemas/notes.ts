import { z } from "zod";
import { isSafeHref } from "./comment";

// A trial's notes are the notes editor's JSON document (tiptap's StarterKit with level-3
// headings). Before it is stored it is checked against what that editor can make: its node and
// mark types, attributes that are plain values, links to http(s) or mailto only, bounded size
// and nesting. Anything else would at best be dropped by the editor and at worst break the page.

const NODES = new Set([
  "doc",
  "paragraph",
  "text",
  "heading",
  "bulletList",
  "orderedList",
  "listItem",
  "blockquote",
  "codeBlock",
  "horizontalRule",
  "hardBreak",
]);
const MARKS = new Set(["bold", "italic", "strike", "underline", "code", "link"]);
const MAX_DEPTH = 40; // node levels (a list item in a list is two): deeper than anyone types
const MAX_JSON_CHARS = 100_000;
const NOT_ALLOWED = "Notes may hold text, headings, lists, quotes, code, rules and links only.";

type Problem = string | null;

function plainAttrs(attrs: unknown): Problem {
  if (attrs === undefined || attrs === null) return null;
  if (typeof attrs !== "object" || Array.isArray(attrs)) return NOT_ALLOWED;
  for (const v of Object.values(attrs)) {
    if (v !== null && !["string", "number", "boolean"].includes(typeof v)) return NOT_ALLOWED;
    if (typeof v === "string" && v.length > 2000) return NOT_ALLOWED;
  }
  return null;
}

function checkMark(m: unknown): Problem {
  if (!m || typeof m !== "object" || Array.isArray(m)) return NOT_ALLOWED;
  const { type, attrs } = m as { type?: unknown; attrs?: unknown };
  if (typeof type !== "string" || !MARKS.has(type)) return NOT_ALLOWED;
  const bad = plainAttrs(attrs);
  if (bad) return bad;
  if (type === "link") {
    const href = (attrs as { href?: unknown } | undefined)?.href;
    if (typeof href !== "string" || !isSafeHref(href)) return "Links must start with http://, https:// or mailto:.";
  }
  return null;
}

function checkNode(n: unknown, depth: number): Problem {
  if (depth > MAX_DEPTH) return "The notes are nested too deeply.";
  if (!n || typeof n !== "object" || Array.isArray(n)) return NOT_ALLOWED;
  const { type, attrs, content, text, marks } = n as { type?: unknown; attrs?: unknown; content?: unknown; text?: unknown; marks?: unknown };
  if (typeof type !== "string" || !NODES.has(type) || (type === "doc") !== (depth === 0)) return NOT_ALLOWED;
  const bad = plainAttrs(attrs);
  if (bad) return bad;
  if (type === "heading") {
    const level = (attrs as { level?: unknown } | undefined)?.level;
    if (level !== undefined && !(Number.isInteger(level) && (level as number) >= 1 && (level as number) <= 6)) return NOT_ALLOWED;
  }
  if (type === "text") {
    if (typeof text !== "string" || text.length === 0 || content !== undefined) return NOT_ALLOWED;
  } else if (text !== undefined) return NOT_ALLOWED;
  if (marks !== undefined) {
    if (!Array.isArray(marks) || marks.length > 6) return NOT_ALLOWED;
    for (const m of marks) {
      const p = checkMark(m);
      if (p) return p;
    }
  }
  if (content !== undefined) {
    if (!Array.isArray(content) || type === "text") return NOT_ALLOWED;
    for (const c of content) {
      const p = checkNode(c, depth + 1);
      if (p) return p;
    }
  }
  return null;
}

/** Length of a value as JSON; Infinity when it cannot be written. */
function jsonLength(v: unknown): number {
  try {
    return JSON.stringify(v).length;
  } catch {
    return Infinity;
  }
}

const FROM_EDITOR = "Notes must come from the notes editor.";

/** Rich notes as the notes editor makes them. */
export const notesDoc = z
  .looseObject({ type: z.literal("doc", { message: FROM_EDITOR }) }, { message: FROM_EDITOR })
  .superRefine((v, ctx) => {
    // Shape first: checkNode stops at MAX_DEPTH, while JSON.stringify of a deep enough value overflows the stack.
    const problem = checkNode(v, 0);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
    else if (jsonLength(v) > MAX_JSON_CHARS) ctx.addIssue({ code: "custom", message: "The notes are too long: keep them under about 50 pages." });
  });
