"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { TimerAction, TimerDto, TimerInput, TimerListDto, TimerResultDto } from "@/lib/schemas/timer";

export type { TimerDto };

/** The list as the client keeps it: with how far this device's clock is behind the server's. */
export interface TimerList extends TimerListDto {
  /** Add to Date.now() to get the server's time (ms). */
  skewMs: number;
}

export const timerKeys = {
  active: (studioId: string) => ["studios", studioId, "timers"] as const,
  ofTrial: (studioId: string, trialId: string) => ["studios", studioId, "timers", { trialId }] as const,
};

/** Server time minus this device's, from a round trip: the server read its clock about half-way. */
function skewFrom(serverNow: string, sentAt: number, receivedAt: number): number {
  return Date.parse(serverNow) - (sentAt + receivedAt) / 2;
}

async function fetchTimers(path: string): Promise<TimerList> {
  const sentAt = Date.now();
  const res = await api<TimerListDto>(path);
  return { ...res, skewMs: skewFrom(res.now, sentAt, Date.now()) };
}

/** The studio's running and paused timers, refreshed often so other devices' timers show up. */
export function useTimers(studioId: string) {
  return useQuery({
    queryKey: timerKeys.active(studioId),
    queryFn: () => fetchTimers(`/api/studios/${studioId}/timers`),
    refetchInterval: 20_000,
    staleTime: 5_000,
  });
}

/** One trial's timers in every state (its finished steps too). */
export function useTrialTimers(studioId: string, trialId: string) {
  return useQuery({
    queryKey: timerKeys.ofTrial(studioId, trialId),
    queryFn: () => fetchTimers(`/api/studios/${studioId}/timers?trialId=${trialId}`),
  });
}

function putTimer(list: TimerList | undefined, result: TimerResultDto, skewMs: number): TimerList | undefined {
  if (!list) return list;
  const others = list.items.filter((t) => t.id !== result.timer.id);
  const active = result.timer.state === "running" || result.timer.state === "paused";
  return { ...list, now: result.now, skewMs, items: active ? [...others, result.timer] : others };
}

function useTimerMutation<V>(studioId: string, send: (v: V) => Promise<TimerResultDto>) {
  const qc = useQueryClient();
  return useMutation({
    // A timer's start time is the server's: a step started offline would start late, so timer
    // changes are never queued; the bar says so instead.
    networkMode: "always",
    mutationFn: async (v: V) => {
      const sentAt = Date.now();
      const result = await send(v);
      return { result, skewMs: skewFrom(result.now, sentAt, Date.now()) };
    },
    onSuccess: ({ result, skewMs }) => {
      qc.setQueryData<TimerList>(timerKeys.active(studioId), (l) => putTimer(l, result, skewMs));
      qc.invalidateQueries({ queryKey: timerKeys.ofTrial(studioId, result.timer.trialId) });
    },
    onError: () => qc.invalidateQueries({ queryKey: timerKeys.active(studioId) }),
  });
}

export function useStartTimer(studioId: string) {
  return useTimerMutation(studioId, (input: TimerInput) =>
    api<TimerResultDto>(`/api/studios/${studioId}/timers`, { method: "POST", body: input }),
  );
}

export function useTimerAction(studioId: string) {
  return useTimerMutation(studioId, ({ timer, action }: { timer: TimerDto; action: TimerAction }) =>
    api<TimerResultDto>(`/api/studios/${studioId}/timers/${timer.id}`, {
      method: "PATCH",
      body: { action, version: timer.version },
    }),
  );
}
