"use client";

import { ButtonLink } from "@/components/ui/button";
import { Sheet, SectionTitle } from "@/components/ui/sheet";
import { useStudio } from "./studio-context";
import { useMembers } from "./use-members";

const ROLE_WORDS = {
  owner: "You run this studio: members, libraries and approving colourways are yours.",
  dyer: "You log trials, photograph swatches, run predictions and propose colourways.",
  guest: "You can read the trials and colourways you are shown, and comment on them.",
} as const;

export function StudioHome({ firstName }: { firstName: string }) {
  const { studioId, studioName, role } = useStudio();
  const members = useMembers(studioId);
  return (
    <div className="space-y-5">
      <header>
        <p className="text-sm uppercase tracking-wide text-ink-faint">{studioName}</p>
        <h1 className="text-3xl">Hello, {firstName}</h1>
        <p className="mt-1 text-ink-soft">{ROLE_WORDS[role]}</p>
      </header>
      <Sheet>
        <SectionTitle>The studio</SectionTitle>
        <p className="tabular text-ink-soft">
          {members.data ? `${members.data.length} ${members.data.length === 1 ? "person" : "people"}` : "…"}
        </p>
        {role === "owner" && members.data && members.data.length < 2 && (
          <p className="mt-2 text-ink-soft">Dyeing alone so far. Invite a studio-mate or a guest to share trials.</p>
        )}
        <div className="mt-4 flex flex-wrap gap-3">
          <ButtonLink href={`/s/${studioId}/members`} variant="plain">
            {role === "owner" ? "People and invitations" : "Who is here"}
          </ButtonLink>
        </div>
      </Sheet>
    </div>
  );
}
