"use client";

import Mention from "@tiptap/extension-mention";
import { type Editor, EditorContent, type JSONContent, useEditor, useEditorState } from "@tiptap/react";
import StarterKit from "@tiptap/starter-kit";
import { useEffect, useRef, useState } from "react";
import { ApiError } from "@/components/api";
import { useStudio } from "@/components/studio/studio-context";
import { type MemberDto, useMembers } from "@/components/studio/use-members";
import { Button } from "@/components/ui/button";
import { commentDoc, isSafeHref } from "@/lib/schemas/comment";
import { EditorToolbar } from "./editor-toolbar";
import { MentionList, type Suggest } from "./mention-list";
import { richTextClass } from "./rich-text";
import { SwatchNode } from "./swatch-node";

// The comment editor: the few formats the server accepts, @mentions of studio members and swatch
// chips. What it sends is the editor's JSON; the server checks it again and renders it.

interface Props {
  label: string;
  submitLabel: string;
  initial?: JSONContent;
  /** Resolves when saved; a thrown ApiError's message is shown under the editor. */
  onSubmit: (doc: JSONContent) => Promise<unknown>;
  onCancel?: () => void;
  /** Clear the editor after a successful save (a new comment, not an edit). */
  clearOnSubmit?: boolean;
  onEditor?: (editor: Editor | null) => void;
}

export function CommentEditor({ label, submitLabel, initial, onSubmit, onCancel, clearOnSubmit, onEditor }: Props) {
  const { studioId, userId } = useStudio();
  const members = useMembers(studioId);
  const membersRef = useRef<MemberDto[]>([]);
  membersRef.current = (members.data ?? []).filter((m) => m.userId !== userId);
  const [suggest, setSuggestState] = useState<Suggest | null>(null);
  const suggestRef = useRef<Suggest | null>(null);
  const setSuggest = useRef((s: Suggest | null) => {
    suggestRef.current = s;
    setSuggestState(s);
  }).current;
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submitRef = useRef<() => void>(() => {});

  const editor = useEditor({
    immediatelyRender: false,
    content: initial ?? "",
    extensions: [
      StarterKit.configure({
        heading: false,
        blockquote: false,
        code: false,
        codeBlock: false,
        horizontalRule: false,
        strike: false,
        underline: false,
        link: {
          openOnClick: false,
          autolink: true,
          defaultProtocol: "https",
          isAllowedUri: (url, ctx) => ctx.defaultValidate(url) && isSafeHref(/^[a-z][a-z0-9+.-]*:/i.test(url) ? url : `https://${url}`),
        },
      }),
      SwatchNode,
      Mention.configure({
        HTMLAttributes: { class: "mention" },
        suggestion: {
          items: ({ query }) =>
            membersRef.current.filter((m) => m.name.toLowerCase().includes(query.toLowerCase())).slice(0, 6),
          render: () => {
            const show = (p: { items: MemberDto[]; command: (a: { id: string; label: string }) => void }) =>
              setSuggest({ items: p.items, index: 0, pick: (m) => p.command({ id: m.userId, label: m.name }) });
            return {
              onStart: show,
              onUpdate: show,
              onExit: () => setSuggest(null),
              onKeyDown: ({ event }) => {
                const s = suggestRef.current;
                if (!s) return false;
                if (event.key === "Escape") {
                  setSuggest(null);
                  return true;
                }
                if (s.items.length === 0) return false;
                const n = s.items.length;
                if (event.key === "ArrowDown") setSuggest({ ...s, index: (s.index + 1) % n });
                else if (event.key === "ArrowUp") setSuggest({ ...s, index: (s.index + n - 1) % n });
                else if (event.key === "Enter" || event.key === "Tab") s.pick(s.items[s.index]);
                else return false;
                return true;
              },
            };
          },
        },
      }),
    ],
    editorProps: {
      attributes: {
        role: "textbox",
        "aria-multiline": "true",
        "aria-label": label,
        class: `${richTextClass} min-h-24 px-3 py-2 focus:outline-none`,
      },
      handleKeyDown: (_view, event) => {
        if (event.key === "Enter" && (event.metaKey || event.ctrlKey)) {
          submitRef.current();
          return true;
        }
        return false;
      },
    },
  });

  useEffect(() => {
    onEditor?.(editor);
    return () => onEditor?.(null);
  }, [editor, onEditor]);

  const empty = useEditorState({ editor, selector: ({ editor: e }) => e?.isEmpty ?? true });

  submitRef.current = async () => {
    if (!editor || busy) return;
    const doc = editor.getJSON();
    const checked = commentDoc.safeParse(doc);
    if (!checked.success) return setError(checked.error.issues[0]?.message ?? "Check the comment.");
    setBusy(true);
    setError(null);
    try {
      await onSubmit(doc);
      if (clearOnSubmit) editor.commands.clearContent(true);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "Could not save the comment. Try again.");
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="rounded-md border border-rule-strong bg-sheet focus-within:border-accent">
      {editor && <EditorToolbar editor={editor} />}
      <div className="relative border-t border-rule">
        <EditorContent editor={editor} />
        {empty && (
          <p aria-hidden="true" className="pointer-events-none absolute top-2 left-3 text-ink-faint">
            Write here. Type @ to mention someone.
          </p>
        )}
      </div>
      {suggest && (
        <div className="border-t border-rule">
          <MentionList suggest={suggest} />
        </div>
      )}
      {error && (
        <p role="alert" className="border-t border-rule px-3 py-2 text-sm text-danger">
          {error}
        </p>
      )}
      <div className="flex items-center justify-end gap-2 border-t border-rule p-2">
        {onCancel && (
          <Button variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
        )}
        <Button onClick={() => submitRef.current()} disabled={busy || empty !== false}>
          {busy ? "Saving…" : submitLabel}
        </Button>
      </div>
    </div>
  );
}
