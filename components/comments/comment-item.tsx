"use client";

import type { JSONContent } from "@tiptap/react";
import { useState } from "react";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { CommentEditor } from "./comment-editor";
import { richTextClass } from "./rich-text";
import { TimeAgo } from "./time-ago";
import type { CommentDto } from "./use-comments";

interface Props {
  comment: CommentDto;
  highlighted: boolean;
  showLayer: boolean;
  onReply?: (c: CommentDto) => void;
  onSave: (c: CommentDto, body: JSONContent) => Promise<unknown>;
  onRemove: (c: CommentDto) => Promise<unknown>;
}

/** One comment: who, when, what (sanitised HTML from the server), and what the reader may do with it. */
export function CommentItem({ comment: c, highlighted, showLayer, onReply, onSave, onRemove }: Props) {
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [error, setError] = useState<string | null>(null);

  if (c.deletedAt) {
    return (
      <li id={`comment-${c.id}`} className="py-3 text-sm text-ink-faint italic">
        A comment by {c.author.name} was removed.
      </li>
    );
  }

  const remove = async () => {
    setError(null);
    try {
      await onRemove(c);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "Could not remove the comment.");
      setConfirming(false);
    }
  };

  return (
    <li
      id={`comment-${c.id}`}
      className={`scroll-mt-24 py-3 ${highlighted ? "-mx-2 rounded-md bg-accent-soft/60 px-2" : ""}`}
      aria-label={`Comment by ${c.author.name}`}
    >
      <div className="flex flex-wrap items-baseline gap-x-2 text-sm">
        <span className="font-medium text-ink">{c.author.name}</span>
        <TimeAgo iso={c.createdAt} className="text-ink-faint" />
        {c.editedAt && <span className="text-ink-faint">· edited</span>}
        {showLayer && c.layerNumber !== null && (
          <span className="rounded border border-rule px-1.5 text-xs text-ink-soft">on layer {c.layerNumber}</span>
        )}
        {showLayer && c.photoId && <span className="rounded border border-rule px-1.5 text-xs text-ink-soft">on a photo</span>}
      </div>

      {editing ? (
        <div className="mt-2">
          <CommentEditor
            label="Edit your comment"
            submitLabel="Save"
            initial={c.body as JSONContent}
            onCancel={() => setEditing(false)}
            onSubmit={async (body) => {
              await onSave(c, body);
              setEditing(false);
            }}
          />
        </div>
      ) : (
        // The server renders comment documents to HTML and passes them through a strict allowlist.
        <div className={`mt-1 ${richTextClass}`} dangerouslySetInnerHTML={{ __html: c.html }} />
      )}

      {!editing && (
        <div className="mt-1 -ml-3 flex flex-wrap items-center gap-1">
          {onReply && (
            <Button variant="quiet" onClick={() => onReply(c)}>
              Reply
            </Button>
          )}
          {c.canEdit && (
            <Button variant="quiet" onClick={() => setEditing(true)}>
              Edit
            </Button>
          )}
          {c.canDelete &&
            (confirming ? (
              <>
                <Button variant="danger" onClick={remove}>
                  Remove comment
                </Button>
                <Button variant="quiet" onClick={() => setConfirming(false)}>
                  Keep
                </Button>
              </>
            ) : (
              <Button variant="quiet" className="text-ink-soft" onClick={() => setConfirming(true)}>
                Remove
              </Button>
            ))}
        </div>
      )}
      {error && (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </li>
  );
}
