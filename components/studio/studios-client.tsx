"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { EmptyState, Sheet, SectionTitle } from "@/components/ui/sheet";
import { useCreateStudio, useStudios } from "./use-studios";

const ROLE_LABEL = { owner: "Owner", dyer: "Dyer", guest: "Guest" } as const;

export function StudiosClient() {
  const router = useRouter();
  const studios = useStudios();
  const create = useCreateStudio();
  const [name, setName] = useState("");
  const fieldError = create.error instanceof ApiError ? create.error.fields?.name ?? create.error.message : undefined;

  return (
    <div className="space-y-6">
      <Sheet>
        <SectionTitle>Your studios</SectionTitle>
        {studios.isPending ? (
          <p className="text-ink-soft">Loading…</p>
        ) : studios.data?.length ? (
          <ul className="divide-y divide-rule">
            {studios.data.map((s) => (
              <li key={s.id}>
                <Link href={`/s/${s.id}`} className="flex min-h-14 items-center justify-between gap-3 py-2 hover:text-accent">
                  <span className="font-medium">{s.name}</span>
                  <span className="text-sm text-ink-soft">{ROLE_LABEL[s.role]}</span>
                </Link>
              </li>
            ))}
          </ul>
        ) : (
          <EmptyState title="You are not in a studio yet">
            Start your own below, or open the invitation link a studio owner sent you.
          </EmptyState>
        )}
      </Sheet>
      <Sheet>
        <SectionTitle>Start a studio</SectionTitle>
        <form
          className="space-y-3"
          onSubmit={(e) => {
            e.preventDefault();
            create.mutate({ name }, { onSuccess: (s) => router.push(`/s/${s.id}`) });
          }}
        >
          <Field label="Studio name" value={name} onChange={(e) => setName(e.target.value)} error={fieldError} required />
          <Button type="submit" disabled={create.isPending}>
            Create the studio
          </Button>
        </form>
      </Sheet>
    </div>
  );
}
