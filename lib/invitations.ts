import "server-only";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Invitation, type Membership, type Role, type Studio, InvitationSchema, MembershipSchema, StudioSchema } from "@/entities/studio";
import { type User, UserSchema } from "@/entities/user";
import { recordActivity, roleWords } from "@/lib/activity";
import { env } from "@/lib/env";
import { conflict, forbidden, HttpError, notFound } from "@/lib/errors";
import { enqueueMail } from "@/lib/outbox";
import type { InvitationInput } from "@/lib/schemas/studio";
import { escapeHtml } from "@/lib/auth/sign-in-mail";
import type { SessionUser } from "@/lib/auth/session";

const VALID_DAYS = 7;

export interface InvitationDto {
  id: string;
  email: string;
  role: Role;
  invitedBy: string;
  expiresAt: string;
  createdAt: string;
}

const hash = (token: string) => createHash("sha256").update(token).digest("hex");

function invitationDto(i: Invitation): InvitationDto {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    invitedBy: i.invitedBy.getEntity().name,
    expiresAt: i.expiresAt.toISOString(),
    createdAt: i.createdAt.toISOString(),
  };
}

export async function listInvitations(em: EntityManager, studio: Studio): Promise<InvitationDto[]> {
  const list = await em.find(
    InvitationSchema,
    { studio, acceptedAt: null, revokedAt: null, expiresAt: { $gt: new Date() } },
    { populate: ["invitedBy"], orderBy: { createdAt: "desc" } },
  );
  return list.map(invitationDto);
}

/** Creates (or renews) an invitation and mails its link; the link's token is stored only as a hash. */
export async function inviteMember(
  em: EntityManager,
  studio: Studio,
  inviter: SessionUser,
  input: InvitationInput,
): Promise<InvitationDto> {
  const existing = await em.findOne(MembershipSchema, { studio, user: { email: input.email } });
  if (existing) throw conflict(`${input.email} is already a member of this studio.`);
  const token = randomBytes(32).toString("base64url");
  const url = `${env.APP_URL}/invite/${token}`;
  // The mail is queued with the invitation: both are stored or neither, and a mail server that
  // is down delays the mail instead of failing the invitation.
  const invitation = await em.transactional(async (tx) => {
    await tx.nativeUpdate(
      InvitationSchema,
      { studio, email: input.email, acceptedAt: null, revokedAt: null },
      { revokedAt: new Date() },
    );
    const inv = tx.create(InvitationSchema, {
      studio,
      email: input.email,
      role: input.role,
      tokenHash: hash(token),
      invitedBy: inviter.id,
      expiresAt: new Date(Date.now() + VALID_DAYS * 86_400_000),
    });
    await enqueueMail(tx, {
      to: input.email,
      subject: `${inviter.name} invited you to ${studio.name} on Undertone`,
      text: `${inviter.name} invited you to join ${studio.name} on Undertone as ${input.role}.\n\nAccept here: ${url}\n\nThe link works for ${VALID_DAYS} days.`,
      html: `<p>${escapeHtml(inviter.name)} invited you to join <strong>${escapeHtml(studio.name)}</strong> on Undertone as ${input.role}.</p><p><a href="${escapeHtml(url)}">Accept the invitation</a></p><p style="color:#6b6259">The link works for ${VALID_DAYS} days.</p>`,
    });
    await tx.flush();
    return inv;
  });
  await em.populate(invitation, ["invitedBy"]);
  return invitationDto(invitation);
}

export async function revokeInvitation(em: EntityManager, studio: Studio, id: string): Promise<void> {
  const inv = await em.findOne(InvitationSchema, { id, studio, acceptedAt: null, revokedAt: null });
  if (!inv) throw notFound("This invitation");
  inv.revokedAt = new Date();
  await em.flush();
}

async function findByToken(em: EntityManager, token: string): Promise<Invitation> {
  const inv = await em.findOne(InvitationSchema, { tokenHash: hash(token) }, { populate: ["studio", "invitedBy"] });
  if (!inv || inv.revokedAt) throw new HttpError(404, "This invitation link is not valid. Ask the studio owner for a new one.");
  if (inv.acceptedAt) throw new HttpError(410, "This invitation has already been used. Sign in to see the studio.");
  if (inv.expiresAt < new Date()) throw new HttpError(410, "This invitation has expired. Ask the studio owner to send a new one.");
  return inv;
}

export interface InvitationPreview {
  studioName: string;
  email: string;
  role: Role;
  invitedBy: string;
}

/** What an invitation link offers, shown before the invitee signs in. */
export async function previewInvitation(em: EntityManager, token: string): Promise<InvitationPreview> {
  const inv = await findByToken(em, token);
  return { studioName: inv.studio.getEntity().name, email: inv.email, role: inv.role, invitedBy: inv.invitedBy.getEntity().name };
}

/** Joins the signed-in user to the studio with the invited role; the address must match. */
export async function acceptInvitation(em: EntityManager, token: string, user: SessionUser): Promise<{ studioId: string }> {
  return em.transactional(async (tx) => {
    const inv = await findByToken(tx, token);
    if (inv.email !== user.email.toLowerCase()) {
      throw forbidden(`This invitation is for ${inv.email}. Sign in with that address to accept it.`);
    }
    const studio = inv.studio.getEntity();
    const already = await tx.findOne(MembershipSchema, { studio, user: user.id });
    if (!already) {
      const m = tx.create(MembershipSchema, { id: randomUUID(), studio, user: user.id, role: inv.role });
      await recordActivity(tx, {
        studio,
        actor: user.id,
        kind: "member.joined",
        summary: `joined the studio as ${roleWords(inv.role)}, invited by ${inv.invitedBy.getEntity().name}`,
        subjectId: m.id,
      });
    }
    inv.acceptedAt = new Date();
    const u = await tx.findOneOrFail(UserSchema, { id: user.id });
    u.emailVerified ??= new Date();
    await tx.flush();
    return { studioId: studio.id };
  });
}
