import { Node, nodeInputRule, nodePasteRule } from "@tiptap/react";

// A colour chip inside a comment: typing or pasting a hex colour (#7a3b5c) turns it into a
// swatch. Stored as { type: "swatch", attrs: { hex } }; the server renders it the same way.

const HEX_IN_TEXT = /(?<![\w/#?&=])#[0-9a-fA-F]{6}\b/g;

export const SwatchNode = Node.create({
  name: "swatch",
  group: "inline",
  inline: true,
  atom: true,
  selectable: true,

  addAttributes() {
    return {
      hex: {
        default: "#000000",
        parseHTML: (el) => el.getAttribute("data-hex"),
        renderHTML: (attrs) => ({ "data-hex": attrs.hex }),
      },
    };
  },

  parseHTML() {
    return [{ tag: "span[data-swatch]" }];
  },

  renderHTML({ node }) {
    const hex = String(node.attrs.hex);
    return [
      "span",
      { "data-swatch": "", "data-hex": hex, class: "swatch", contenteditable: "false" },
      ["span", { class: "swatch-dot", style: `background-color:${hex}` }],
      hex,
    ];
  },

  renderText({ node }) {
    return String(node.attrs.hex);
  },

  addInputRules() {
    return [
      nodeInputRule({
        find: /(?:^|\s)(#[0-9a-fA-F]{6})\s$/,
        type: this.type,
        getAttributes: (m) => ({ hex: m[1].toLowerCase() }),
      }),
    ];
  },

  addPasteRules() {
    return [nodePasteRule({ find: HEX_IN_TEXT, type: this.type, getAttributes: (m) => ({ hex: m[0].toLowerCase() }) })];
  },
});
