"use client";

import type { MemberDto } from "@/components/studio/use-members";

// The members matching what follows "@", as big buttons under the editor (thumb-sized on a phone).

export interface Suggest {
  items: MemberDto[];
  index: number;
  pick: (m: MemberDto) => void;
}

export function MentionList({ suggest }: { suggest: Suggest }) {
  if (suggest.items.length === 0) {
    return <p className="px-3 py-2 text-sm text-ink-soft">No member by that name. Only members of this studio can be mentioned.</p>;
  }
  return (
    <ul role="listbox" aria-label="Mention a member" className="divide-y divide-rule">
      {suggest.items.map((m, i) => (
        <li key={m.userId} role="option" aria-selected={i === suggest.index}>
          <button
            type="button"
            // Keep the editor's selection: the click must not blur it.
            onMouseDown={(e) => e.preventDefault()}
            onClick={() => suggest.pick(m)}
            className={`flex min-h-11 w-full items-center justify-between gap-3 px-3 text-left ${
              i === suggest.index ? "bg-accent-soft" : "hover:bg-paper"
            }`}
          >
            <span className="font-medium">{m.name}</span>
            <span className="text-sm text-ink-soft">{m.role}</span>
          </button>
        </li>
      ))}
    </ul>
  );
}
