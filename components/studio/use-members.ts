"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";

export type Role = "owner" | "dyer" | "guest";

export interface MemberDto {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export interface InvitationDto {
  id: string;
  email: string;
  role: Role;
  invitedBy: string;
  expiresAt: string;
  createdAt: string;
}

export const memberKeys = {
  members: (studioId: string) => ["studios", studioId, "members"] as const,
  invitations: (studioId: string) => ["studios", studioId, "invitations"] as const,
};

export function useMembers(studioId: string) {
  return useQuery({ queryKey: memberKeys.members(studioId), queryFn: () => api<MemberDto[]>(`/api/studios/${studioId}/members`) });
}

export function useInvitations(studioId: string, enabled: boolean) {
  return useQuery({
    queryKey: memberKeys.invitations(studioId),
    queryFn: () => api<InvitationDto[]>(`/api/studios/${studioId}/invitations`),
    enabled,
  });
}

export function useChangeRole(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: Role }) =>
      api<MemberDto>(`/api/studios/${studioId}/members/${memberId}`, { method: "PATCH", body: { role } }),
    onSettled: () => qc.invalidateQueries({ queryKey: memberKeys.members(studioId) }),
  });
}

export function useRemoveMember(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (memberId: string) => api<void>(`/api/studios/${studioId}/members/${memberId}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: memberKeys.members(studioId) }),
  });
}

export function useInvite(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { email: string; role: Role }) =>
      api<InvitationDto>(`/api/studios/${studioId}/invitations`, { method: "POST", body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: memberKeys.invitations(studioId) }),
  });
}

export function useRevokeInvitation(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<void>(`/api/studios/${studioId}/invitations/${id}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: memberKeys.invitations(studioId) }),
  });
}
