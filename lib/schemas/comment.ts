import { z } from "zod";

// A comment is the editor's JSON document, checked against an allowlist of node and mark types
// before it is stored: paragraphs, lists, bold, italic, safe links, mentions and swatch chips.
// Shared by the comment editor (to check before sending) and the route handlers.

export const HEX_COLOUR = /^#[0-9a-f]{6}$/i;
const SAFE_PROTOCOLS = new Set(["http:", "https:", "mailto:"]);
const MAX_DEPTH = 12;
const MAX_JSON_CHARS = 40_000;
export const MAX_COMMENT_CHARS = 5_000;

/** Whether a link may be stored: an absolute http(s) or mailto address, nothing else. */
export function isSafeHref(href: string): boolean {
  try {
    return SAFE_PROTOCOLS.has(new URL(href.trim()).protocol);
  } catch {
    return false;
  }
}

export type Mark = { type: "bold" } | { type: "italic" } | { type: "link"; attrs: { href: string } };
export type TextNode = { type: "text"; text: string; marks?: Mark[] };
export type MentionNode = { type: "mention"; attrs: { id: string; label?: string | null } };
export type SwatchNode = { type: "swatch"; attrs: { hex: string } };
export type InlineNode = TextNode | MentionNode | SwatchNode | { type: "hardBreak" };
export type Paragraph = { type: "paragraph"; content?: InlineNode[] };
export type ListItem = { type: "listItem"; content: BlockNode[] };
export type BulletList = { type: "bulletList"; content: ListItem[] };
export type OrderedList = { type: "orderedList"; attrs?: { start?: number }; content: ListItem[] };
export type BlockNode = Paragraph | BulletList | OrderedList;
export type CommentDocument = { type: "doc"; content: BlockNode[] };

const notAllowed = "Comments may hold text, lists, bold, italic, links, mentions and swatches only.";

const mark = z.discriminatedUnion(
  "type",
  [
    z.object({ type: z.literal("bold") }),
    z.object({ type: z.literal("italic") }),
    z.object({
      type: z.literal("link"),
      attrs: z.object({
        href: z.string().max(2000).refine(isSafeHref, "Links must start with http://, https:// or mailto:."),
      }),
    }),
  ],
  { error: notAllowed },
);

const inline = z.discriminatedUnion(
  "type",
  [
    z.object({
      type: z.literal("text"),
      text: z.string().min(1).max(MAX_COMMENT_CHARS),
      marks: z.array(mark).max(3).optional(),
    }),
    z.object({
      type: z.literal("mention"),
      attrs: z.object({ id: z.uuid("A mention must name a member."), label: z.string().max(120).nullish() }),
    }),
    z.object({
      type: z.literal("swatch"),
      attrs: z.object({ hex: z.string().regex(HEX_COLOUR, "A swatch is a colour like #7a3b5c.") }),
    }),
    z.object({ type: z.literal("hardBreak") }),
  ],
  { error: notAllowed },
);

const paragraph = z.object({ type: z.literal("paragraph"), content: z.array(inline).max(1000).optional() });

const block: z.ZodType<BlockNode> = z.lazy(() =>
  z.discriminatedUnion("type", [paragraph, bulletList, orderedList], { error: notAllowed }),
);
const listItem: z.ZodType<ListItem> = z.lazy(() =>
  z.object({ type: z.literal("listItem"), content: z.array(block).min(1).max(50) }),
);
const bulletList = z.object({ type: z.literal("bulletList"), content: z.array(listItem).min(1).max(200) });
const orderedList = z.object({
  type: z.literal("orderedList"),
  attrs: z.object({ start: z.number().int().min(0).max(100_000).optional() }).optional(),
  content: z.array(listItem).min(1).max(200),
});

/** Nesting depth of a value, counted no further than just past MAX_DEPTH (so any input is cheap). */
function depth(v: unknown, d = 0): number {
  if (d > MAX_DEPTH) return d;
  const children = Array.isArray(v) ? v : v && typeof v === "object" ? Object.values(v) : [];
  let max = d;
  for (const x of children) {
    max = Math.max(max, depth(x, d + 1));
    if (max > MAX_DEPTH) break;
  }
  return max;
}

/** The comment document: size and nesting are bounded before the structure is checked. */
export const commentDoc = z
  .unknown()
  .superRefine((v, ctx) => {
    // Depth first: depth() stops at MAX_DEPTH, while JSON.stringify of a deep enough value overflows the stack.
    if (depth(v) > MAX_DEPTH) ctx.addIssue({ code: "custom", message: "Lists are nested too deeply." });
    else if (JSON.stringify(v ?? null).length > MAX_JSON_CHARS) ctx.addIssue({ code: "custom", message: "This comment is too long." });
  })
  .pipe(z.object({ type: z.literal("doc", { error: notAllowed }), content: z.array(block).min(1).max(200) }))
  .refine((d) => docText(d).trim().length > 0 || mentionIds(d).length > 0 || hasSwatch(d), "Write something first.")
  .refine((d) => docText(d).length <= MAX_COMMENT_CHARS, `Keep a comment under ${MAX_COMMENT_CHARS} characters.`);

export const commentInput = z.object({
  body: commentDoc,
  layerId: z.uuid("Choose a layer of this trial.").nullish(),
  photoId: z.uuid("Choose a photo of this trial.").nullish(),
});

export const commentUpdate = z.object({
  body: commentDoc,
  version: z.number({ error: "Send the version you last saw." }).int().min(1),
});

export type CommentInput = z.infer<typeof commentInput>;
export type CommentUpdate = z.infer<typeof commentUpdate>;

type AnyNode = { type?: string; text?: string; content?: unknown[]; attrs?: Record<string, unknown> };

function walk(node: unknown, visit: (n: AnyNode) => void): void {
  if (!node || typeof node !== "object") return;
  const n = node as AnyNode;
  visit(n);
  if (Array.isArray(n.content)) for (const c of n.content) walk(c, visit);
}

/** Plain text of a document: paragraphs and list items on their own lines, mentions as @name. */
export function docText(doc: unknown): string {
  const parts: string[] = [];
  const visitBlock = (n: unknown): void => {
    if (!n || typeof n !== "object") return;
    const node = n as AnyNode;
    if (node.type === "paragraph") {
      parts.push(
        (node.content ?? [])
          .map((c) => {
            const i = c as AnyNode;
            if (i.type === "text") return i.text ?? "";
            if (i.type === "mention") return `@${String(i.attrs?.label ?? "member")}`;
            if (i.type === "swatch") return String(i.attrs?.hex ?? "");
            if (i.type === "hardBreak") return "\n";
            return "";
          })
          .join(""),
      );
    } else if (Array.isArray(node.content)) {
      for (const c of node.content) visitBlock(c);
    }
  };
  visitBlock(doc);
  return parts.join("\n").replace(/\n{3,}/g, "\n\n").trim();
}

/** Ids of the members a document mentions, each once, in order. */
export function mentionIds(doc: unknown): string[] {
  const ids: string[] = [];
  walk(doc, (n) => {
    if (n.type === "mention" && typeof n.attrs?.id === "string" && !ids.includes(n.attrs.id)) ids.push(n.attrs.id);
  });
  return ids;
}

function hasSwatch(doc: unknown): boolean {
  let found = false;
  walk(doc, (n) => {
    if (n.type === "swatch") found = true;
  });
  return found;
}
