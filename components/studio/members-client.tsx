"use client";

import { useState } from "react";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice, Sheet, SectionTitle } from "@/components/ui/sheet";
import { useCan, useStudio } from "./studio-context";
import {
  type Role,
  useChangeRole,
  useInvitations,
  useInvite,
  useMembers,
  useRemoveMember,
  useRevokeInvitation,
} from "./use-members";

const ROLES: { value: Role; label: string }[] = [
  { value: "owner", label: "Owner" },
  { value: "dyer", label: "Dyer" },
  { value: "guest", label: "Guest" },
];

export function MembersClient() {
  const { studioId, userId } = useStudio();
  const manage = useCan("member.manage");
  const members = useMembers(studioId);
  const changeRole = useChangeRole(studioId);
  const remove = useRemoveMember(studioId);
  const error = changeRole.error ?? remove.error;

  return (
    <div className="space-y-5">
      <h1 className="text-3xl">People</h1>
      <Sheet>
        <SectionTitle>Members</SectionTitle>
        {error && (
          <Notice tone="danger" className="mb-3">
            {error.message}
          </Notice>
        )}
        <ul className="divide-y divide-rule">
          {members.data?.map((m) => (
            <li key={m.id} className="flex flex-col gap-2 py-3 sm:flex-row sm:items-center sm:justify-between">
              <div className="min-w-0">
                <p className="font-medium">
                  {m.name} {m.userId === userId && <span className="text-sm font-normal text-ink-faint">(you)</span>}
                </p>
                <p className="text-sm text-ink-soft wrap-break-word">
                  <Address value={m.email} />
                </p>
              </div>
              {manage ? (
                <div className="flex items-end gap-2">
                  <Select
                    label={`Role of ${m.name}`}
                    className="w-36 [&>label]:sr-only"
                    value={m.role}
                    onChange={(e) => changeRole.mutate({ memberId: m.id, role: e.target.value as Role })}
                  >
                    {ROLES.map((r) => (
                      <option key={r.value} value={r.value}>
                        {r.label}
                      </option>
                    ))}
                  </Select>
                  <Button
                    variant="danger"
                    aria-label={`Remove ${m.name}`}
                    onClick={() => {
                      if (confirm(`Remove ${m.name} from the studio?`)) remove.mutate(m.id);
                    }}
                  >
                    Remove
                  </Button>
                </div>
              ) : (
                <span className="text-sm text-ink-soft">{ROLES.find((r) => r.value === m.role)?.label}</span>
              )}
            </li>
          ))}
        </ul>
      </Sheet>
      {manage && <Invitations studioId={studioId} />}
    </div>
  );
}

function Invitations({ studioId }: { studioId: string }) {
  const list = useInvitations(studioId, true);
  const invite = useInvite(studioId);
  const revoke = useRevokeInvitation(studioId);
  const [email, setEmail] = useState("");
  const [role, setRole] = useState<Role>("dyer");
  const fields = invite.error instanceof ApiError ? invite.error.fields : undefined;

  return (
    <Sheet>
      <SectionTitle>Invite someone</SectionTitle>
      <form
        className="space-y-3"
        onSubmit={(e) => {
          e.preventDefault();
          invite.mutate({ email, role }, { onSuccess: () => setEmail("") });
        }}
      >
        <Field
          label="Their e-mail"
          type="email"
          inputMode="email"
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          error={fields?.email}
          required
        />
        <Select label="Role" value={role} onChange={(e) => setRole(e.target.value as Role)} error={fields?.role}>
          <option value="dyer">Dyer — logs trials and photos</option>
          <option value="guest">Guest — reads and comments</option>
          <option value="owner">Owner — runs the studio</option>
        </Select>
        {invite.error && !fields && <Notice tone="danger">{invite.error.message}</Notice>}
        {invite.isSuccess && <Notice tone="ok">Invitation sent to {invite.data.email}.</Notice>}
        <Button type="submit" disabled={invite.isPending}>
          Send the invitation
        </Button>
      </form>
      {list.data && list.data.length > 0 && (
        <>
          <h3 className="mt-6 mb-2 text-lg">Waiting for an answer</h3>
          <ul className="divide-y divide-rule">
            {list.data.map((i) => (
              <li key={i.id} className="flex items-center justify-between gap-3 py-2">
                <div className="min-w-0">
                  <p className="wrap-break-word">
                    <Address value={i.email} />
                  </p>
                  <p className="text-sm text-ink-soft">
                    {i.role} · until {new Date(i.expiresAt).toLocaleDateString()}
                  </p>
                </div>
                <Button variant="quiet" onClick={() => revoke.mutate(i.id)}>
                  Withdraw
                </Button>
              </li>
            ))}
          </ul>
        </>
      )}
    </Sheet>
  );
}

/** An e-mail address that, when it must wrap on a narrow screen, breaks after the "@" first. */
function Address({ value }: { value: string }) {
  const at = value.lastIndexOf("@");
  if (at < 0) return <>{value}</>;
  return (
    <>
      {value.slice(0, at + 1)}
      <wbr />
      {value.slice(at + 1)}
    </>
  );
}
