"use client";

import { EditorContent, useEditor, useEditorState } from "@tiptap/react";
import StarterKit from "@tiptap/starter-kit";
import { useEffect, useState } from "react";
import { Button } from "@/components/ui/button";

type Doc = Record<string, unknown>;

const EMPTY_DOC: Doc = { type: "doc", content: [{ type: "paragraph" }] };

/** The trial's rich notes: read by everyone, written by those who may edit; saved as the editor's JSON. */
export function TrialNotes({ notes, canEdit, onSave }: { notes: Doc | null; canEdit: boolean; onSave: (doc: Doc) => void }) {
  const [dirty, setDirty] = useState(false);
  const editor = useEditor({
    extensions: [StarterKit.configure({ heading: { levels: [3] }, link: { openOnClick: !canEdit } })],
    content: notes ?? EMPTY_DOC,
    editable: canEdit,
    immediatelyRender: false,
    editorProps: {
      attributes: {
        class: `min-h-24 [&_ul]:list-disc [&_ul]:pl-6 [&_ol]:list-decimal [&_ol]:pl-6 [&_h3]:text-lg [&_h3]:font-serif [&_p]:my-1 [&_a]:underline focus:outline-none ${
          canEdit ? "rounded-md border border-rule-strong bg-sheet px-3 py-2 focus:border-accent" : ""
        }`,
        "aria-label": "Trial notes",
        role: "textbox",
        "aria-multiline": "true",
      },
    },
    onUpdate: () => setDirty(true),
  });
  // A newer version from the server replaces the text only while nothing is being typed.
  useEffect(() => {
    if (!editor || dirty) return;
    const incoming = JSON.stringify(notes ?? EMPTY_DOC);
    if (JSON.stringify(editor.getJSON()) !== incoming) editor.commands.setContent(notes ?? EMPTY_DOC, { emitUpdate: false });
  }, [editor, notes, dirty]);
  const marks = useEditorState({
    editor,
    selector: (c) => ({
      bold: c.editor?.isActive("bold") ?? false,
      italic: c.editor?.isActive("italic") ?? false,
      list: c.editor?.isActive("bulletList") ?? false,
      heading: c.editor?.isActive("heading", { level: 3 }) ?? false,
    }),
  });

  if (!canEdit && !notes) return <p className="text-ink-soft">No notes yet.</p>;
  const tool = (label: string, active: boolean | undefined, run: () => void, text: React.ReactNode) => (
    <button
      type="button"
      aria-label={label}
      aria-pressed={!!active}
      onMouseDown={(e) => e.preventDefault()}
      onClick={run}
      className={`flex h-11 min-w-11 items-center justify-center rounded-md border px-2 ${active ? "border-accent bg-accent-soft text-accent" : "border-rule bg-sheet"}`}
    >
      {text}
    </button>
  );
  return (
    <div className="space-y-2">
      {canEdit && editor && (
        <div className="flex flex-wrap gap-1" role="toolbar" aria-label="Text style">
          {tool("Bold", marks?.bold, () => editor.chain().focus().toggleBold().run(), <strong>B</strong>)}
          {tool("Italic", marks?.italic, () => editor.chain().focus().toggleItalic().run(), <em>I</em>)}
          {tool("Bulleted list", marks?.list, () => editor.chain().focus().toggleBulletList().run(), "• —")}
          {tool("Heading", marks?.heading, () => editor.chain().focus().toggleHeading({ level: 3 }).run(), "H")}
        </div>
      )}
      <EditorContent editor={editor} />
      {canEdit && dirty && editor && (
        <div className="flex gap-2">
          <Button
            onClick={() => {
              onSave(editor.getJSON() as Doc);
              setDirty(false);
            }}
          >
            Save notes
          </Button>
          <Button
            variant="plain"
            onClick={() => {
              editor.commands.setContent(notes ?? EMPTY_DOC, { emitUpdate: false });
              setDirty(false);
            }}
          >
            Undo changes
          </Button>
        </div>
      )}
    </div>
  );
}
