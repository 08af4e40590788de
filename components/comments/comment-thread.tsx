"use client";

import type { Editor } from "@tiptap/react";
import { useCallback, useEffect, useRef, useState } from "react";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { EmptyState, Notice, SectionTitle } from "@/components/ui/sheet";
import { CommentEditor } from "./comment-editor";
import { CommentItem } from "./comment-item";
import { FollowButton } from "./follow-button";
import { type CommentDto, useAddComment, useComments, useDeleteComment, useEditComment } from "./use-comments";

/**
 * The conversation about a trial (or one of its layers or photos): the comments, oldest first, a
 * follow button and the editor. Self-contained: drop it at the bottom of a trial page.
 */
export function CommentThread({ trialId, layerId, photoId }: { trialId: string; layerId?: string; photoId?: string }) {
  const { studioId, userId } = useStudio();
  const canWrite = useCan("comment.write");
  const thread = useComments(studioId, trialId, { layerId, photoId });
  const scoped = Boolean(layerId || photoId);
  const headingId = `comments-${layerId ?? photoId ?? trialId}`;
  const add = useAddComment(studioId, trialId);
  const edit = useEditComment(studioId, trialId);
  const remove = useDeleteComment(studioId, trialId);
  const editorRef = useRef<Editor | null>(null);
  const formRef = useRef<HTMLDivElement>(null);
  const [target, setTarget] = useState<string | null>(null);
  const onEditor = useCallback((e: Editor | null) => {
    editorRef.current = e;
  }, []);

  // A link to #comment-… (from a mail or a notification) scrolls to that comment and marks it.
  useEffect(() => {
    const id = window.location.hash.match(/^#comment-([0-9a-f-]{36})$/)?.[1];
    if (!id || !thread.data?.some((c) => c.id === id)) return;
    setTarget(id);
    document.getElementById(`comment-${id}`)?.scrollIntoView({ block: "center" });
  }, [thread.data]);

  const reply = (c: CommentDto) => {
    const e = editorRef.current;
    if (!e) return;
    formRef.current?.scrollIntoView({ block: "center" });
    const chain = e.chain().focus("end");
    if (c.author.id !== userId) chain.insertContent([{ type: "mention", attrs: { id: c.author.id, label: c.author.name } }, { type: "text", text: " " }]);
    chain.run();
  };

  const comments = thread.data ?? [];
  return (
    <section aria-labelledby={headingId} className="mt-8">
      <SectionTitle action={<FollowButton trialId={trialId} />}>
        <span id={headingId}>{layerId ? "Comments on this layer" : photoId ? "Comments on this photo" : "Comments"}</span>
      </SectionTitle>

      {thread.isError && <Notice tone="danger">Could not load the comments. {thread.error.message}</Notice>}
      {thread.isPending && <p className="py-3 text-ink-soft">Loading comments…</p>}
      {thread.isSuccess && comments.length === 0 && (
        <EmptyState title="No comments yet">
          {canWrite ? "Ask a question or note what you see; type @ to bring someone in." : "Comments from the studio will appear here."}
        </EmptyState>
      )}
      {comments.length > 0 && (
        <ol className="divide-y divide-rule" aria-label="Comments">
          {comments.map((c) => (
            <CommentItem
              key={c.id}
              comment={c}
              highlighted={c.id === target}
              showLayer={!scoped}
              onReply={canWrite ? reply : undefined}
              onSave={(x, body) => edit.mutateAsync({ id: x.id, body, version: x.version })}
              onRemove={(x) => remove.mutateAsync({ id: x.id, version: x.version })}
            />
          ))}
        </ol>
      )}

      {canWrite && (
        <div ref={formRef} className="mt-4">
          <CommentEditor
            label={layerId ? "Comment on this layer" : photoId ? "Comment on this photo" : "Write a comment"}
            submitLabel="Post comment"
            clearOnSubmit
            onEditor={onEditor}
            onSubmit={(body) => add.mutateAsync({ body, layerId: layerId ?? null, photoId: photoId ?? null })}
          />
        </div>
      )}
    </section>
  );
}
