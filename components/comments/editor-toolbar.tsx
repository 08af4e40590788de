"use client";

import { type Editor, useEditorState } from "@tiptap/react";
import { useEffect, useRef, useState } from "react";
import { inputClass } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { isSafeHref } from "@/lib/schemas/comment";

// Formatting for a comment: bold, italic, lists, a link, a swatch chip and a mention.

const tool =
  "inline-flex h-11 min-w-11 items-center justify-center rounded-md border border-transparent px-2 text-ink-soft hover:bg-paper aria-pressed:border-rule-strong aria-pressed:bg-paper aria-pressed:text-ink";

function ToolButton({ label, pressed, onClick, children }: { label: string; pressed?: boolean; onClick: () => void; children: React.ReactNode }) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      aria-pressed={pressed}
      onMouseDown={(e) => e.preventDefault()}
      onClick={onClick}
      className={tool}
    >
      {children}
    </button>
  );
}

function SwatchPicker({ editor }: { editor: Editor }) {
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => {
    const input = ref.current;
    if (!input) return;
    // "change" fires once the colour is chosen; React's onChange fires on every drag step.
    const onChange = () =>
      editor.chain().focus().insertContent([{ type: "swatch", attrs: { hex: input.value.toLowerCase() } }, { type: "text", text: " " }]).run();
    input.addEventListener("change", onChange);
    return () => input.removeEventListener("change", onChange);
  }, [editor]);
  return (
    <label className={`${tool} cursor-pointer`} title="Add a swatch">
      <svg width="22" height="22" viewBox="0 0 22 22" aria-hidden="true">
        <circle cx="11" cy="11" r="7.5" fill="none" stroke="currentColor" strokeWidth="1.5" />
        <path d="M11 3.5a7.5 7.5 0 0 1 0 15z" fill="currentColor" opacity="0.55" />
      </svg>
      <span className="sr-only">Add a swatch</span>
      <input ref={ref} type="color" defaultValue="#7a3b5c" className="sr-only" />
    </label>
  );
}

function LinkForm({ editor, onDone }: { editor: Editor; onDone: () => void }) {
  const [value, setValue] = useState(() => String(editor.getAttributes("link").href ?? ""));
  const [error, setError] = useState<string | null>(null);
  const apply = () => {
    const raw = value.trim();
    if (!raw) {
      editor.chain().focus().extendMarkRange("link").unsetLink().run();
      return onDone();
    }
    const href = /^[a-z][a-z0-9+.-]*:/i.test(raw) ? raw : `https://${raw}`;
    if (!isSafeHref(href)) return setError("Links must start with http://, https:// or mailto:.");
    if (editor.state.selection.empty && !editor.isActive("link")) {
      editor.chain().focus().insertContent([{ type: "text", text: raw, marks: [{ type: "link", attrs: { href } }] }, { type: "text", text: " " }]).run();
    } else {
      editor.chain().focus().extendMarkRange("link").setLink({ href }).run();
    }
    onDone();
  };
  return (
    <div className="flex flex-wrap items-start gap-2 border-t border-rule p-2">
      <label className="sr-only" htmlFor="comment-link">
        Link address
      </label>
      <input
        id="comment-link"
        autoFocus
        type="url"
        inputMode="url"
        placeholder="https://…"
        value={value}
        onChange={(e) => setValue(e.target.value)}
        onKeyDown={(e) => {
          if (e.key === "Enter") {
            e.preventDefault();
            apply();
          }
          if (e.key === "Escape") onDone();
        }}
        className={`${inputClass} min-w-0 flex-1`}
      />
      <Button variant="plain" onClick={apply}>
        Add link
      </Button>
      {error && (
        <p role="alert" className="w-full text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
}

/** Types "@" (with a space before it when needed) so the member list opens. */
function insertAt(editor: Editor) {
  const { from } = editor.state.selection;
  const before = editor.state.doc.textBetween(Math.max(0, from - 1), from, "\n", "\n");
  editor.chain().focus().insertContent(before === "" || /\s/.test(before) ? "@" : " @").run();
}

export function EditorToolbar({ editor }: { editor: Editor }) {
  const [linkOpen, setLinkOpen] = useState(false);
  const state = useEditorState({
    editor,
    selector: ({ editor: e }) => ({
      bold: e.isActive("bold"),
      italic: e.isActive("italic"),
      bullet: e.isActive("bulletList"),
      ordered: e.isActive("orderedList"),
      link: e.isActive("link"),
    }),
  });
  return (
    <div>
      <div role="toolbar" aria-label="Formatting" className="flex flex-wrap items-center gap-0.5 px-1 py-1">
        <ToolButton label="Bold" pressed={state.bold} onClick={() => editor.chain().focus().toggleBold().run()}>
          <span className="font-bold">B</span>
        </ToolButton>
        <ToolButton label="Italic" pressed={state.italic} onClick={() => editor.chain().focus().toggleItalic().run()}>
          <span className="font-serif italic">I</span>
        </ToolButton>
        <ToolButton label="Bulleted list" pressed={state.bullet} onClick={() => editor.chain().focus().toggleBulletList().run()}>
          <span aria-hidden="true">••</span>
        </ToolButton>
        <ToolButton label="Numbered list" pressed={state.ordered} onClick={() => editor.chain().focus().toggleOrderedList().run()}>
          <span aria-hidden="true" className="tabular">1.</span>
        </ToolButton>
        <ToolButton label="Link" pressed={state.link || linkOpen} onClick={() => setLinkOpen((o) => !o)}>
          <svg width="20" height="20" viewBox="0 0 20 20" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            <path d="M8.5 11.5a3 3 0 0 0 4.2 0l3-3a3 3 0 0 0-4.2-4.2l-1 1M11.5 8.5a3 3 0 0 0-4.2 0l-3 3a3 3 0 0 0 4.2 4.2l1-1" />
          </svg>
        </ToolButton>
        <SwatchPicker editor={editor} />
        <ToolButton label="Mention someone" onClick={() => insertAt(editor)}>
          <span aria-hidden="true">@</span>
        </ToolButton>
      </div>
      {linkOpen && <LinkForm editor={editor} onDone={() => setLinkOpen(false)} />}
    </div>
  );
}
