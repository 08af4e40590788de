import "server-only";
import sanitizeHtml from "sanitize-html";
import { HEX_COLOUR, isSafeHref } from "@/lib/schemas/comment";

// Comment documents to HTML on the server. The renderer writes only the tags it knows and
// escapes every piece of text; sanitize-html then passes the result through a strict allowlist,
// so a document that slipped past validation (old rows, a bug) still renders inert.

const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

type Node = { type?: unknown; text?: unknown; content?: unknown; marks?: unknown; attrs?: Record<string, unknown> };

const children = (n: Node, names: Map<string, string>) =>
  Array.isArray(n.content) ? n.content.map((c) => renderNode(c, names)).join("") : "";

function renderText(n: Node): string {
  let html = escape(typeof n.text === "string" ? n.text : "");
  const marks = Array.isArray(n.marks) ? (n.marks as Node[]) : [];
  for (const m of marks) {
    if (m?.type === "bold") html = `<strong>${html}</strong>`;
    else if (m?.type === "italic") html = `<em>${html}</em>`;
    else if (m?.type === "link" && typeof m.attrs?.href === "string" && isSafeHref(m.attrs.href)) {
      html = `<a href="${escape(m.attrs.href.trim())}">${html}</a>`;
    }
  }
  return html;
}

function renderNode(node: unknown, names: Map<string, string>): string {
  if (!node || typeof node !== "object") return "";
  const n = node as Node;
  switch (n.type) {
    case "doc":
      return children(n, names);
    case "paragraph":
      return `<p>${children(n, names)}</p>`;
    case "bulletList":
      return `<ul>${children(n, names)}</ul>`;
    case "orderedList": {
      const start = Number(n.attrs?.start);
      return `<ol${Number.isInteger(start) && start > 1 ? ` start="${start}"` : ""}>${children(n, names)}</ol>`;
    }
    case "listItem":
      return `<li>${children(n, names)}</li>`;
    case "hardBreak":
      return "<br />";
    case "text":
      return renderText(n);
    case "mention": {
      const id = typeof n.attrs?.id === "string" ? n.attrs.id : "";
      const label = names.get(id) ?? (typeof n.attrs?.label === "string" ? n.attrs.label : "member");
      return `<span class="mention" data-user-id="${escape(id)}">@${escape(label)}</span>`;
    }
    case "swatch": {
      const hex = typeof n.attrs?.hex === "string" && HEX_COLOUR.test(n.attrs.hex) ? n.attrs.hex.toLowerCase() : null;
      if (!hex) return "";
      return `<span class="swatch" data-hex="${hex}"><span class="swatch-dot" style="background-color:${hex}"></span>${hex}</span>`;
    }
    default:
      // Unknown nodes render nothing: never their attributes, never raw markup.
      return "";
  }
}

const policy: sanitizeHtml.IOptions = {
  allowedTags: ["p", "br", "strong", "em", "ul", "ol", "li", "a", "span"],
  allowedAttributes: {
    a: ["href", "rel", "target"],
    ol: ["start"],
    span: ["class", "data-user-id", "data-hex", "style"],
  },
  allowedClasses: { span: ["mention", "swatch", "swatch-dot"] },
  allowedStyles: { span: { "background-color": [/^#[0-9a-f]{6}$/i] } },
  allowedSchemes: ["http", "https", "mailto"],
  allowedSchemesAppliedToAttributes: ["href"],
  allowProtocolRelative: false,
  disallowedTagsMode: "discard",
  transformTags: {
    a: (tagName, attribs) => ({
      tagName,
      attribs: { ...attribs, rel: "noopener noreferrer nofollow ugc", target: "_blank" },
    }),
  },
};

/** Safe HTML for a comment document; `names` maps mentioned user ids to their current names. */
export function renderCommentHtml(doc: unknown, names: Map<string, string> = new Map()): string {
  return sanitizeHtml(renderNode(doc, names), policy);
}

/** A one-paragraph plain excerpt for mail and notifications. */
export function excerpt(text: string, max = 280): string {
  const flat = text.replace(/\s+/g, " ").trim();
  return flat.length <= max ? flat : `${flat.slice(0, max - 1).trimEnd()}…`;
}
