import { z } from "zod";

// Step timers: starting one, and what can be done to it afterwards. Shared by the timer bar's
// forms and the route handlers; the remaining-time arithmetic is here too so both ends agree.

export const TIMER_ACTIONS = ["pause", "resume", "finish", "cancel"] as const;
export type TimerAction = (typeof TIMER_ACTIONS)[number];

/** The longest step we time: a day (an overnight cool-down fits). */
export const MAX_TIMER_SEC = 24 * 3600;

export const timerInput = z.object({
  trialId: z.uuid({ message: "Choose the trial this timer belongs to." }),
  layerId: z.uuid({ message: "Choose a layer of this trial." }).nullish(),
  label: z.string().trim().min(1, "Name the step, like “Steam”.").max(80, "Keep the name under 80 characters."),
  durationSec: z
    .number({ message: "Enter the length in minutes." })
    .int("Use whole seconds.")
    .min(1, "A timer runs for at least one second.")
    .max(MAX_TIMER_SEC, "A timer runs for a day at most."),
});

export const timerActionInput = z.object({
  action: z.enum(TIMER_ACTIONS, { message: "Choose pause, resume, finish or cancel." }),
  version: z.number({ message: "Send the version you last saw." }).int().min(1),
});

export type TimerInput = z.infer<typeof timerInput>;
export type TimerActionInput = z.infer<typeof timerActionInput>;

export type TimerState = "running" | "paused" | "done" | "cancelled";

export interface TimerDto {
  id: string;
  trialId: string;
  trialTitle: string;
  layerId: string | null;
  label: string;
  durationSec: number;
  /** Seconds counted before the current run. */
  elapsedSec: number;
  /** ISO time the current run began, or null when not running. */
  runningSince: string | null;
  state: TimerState;
  finishedAt: string | null;
  version: number;
  startedBy: { id: string; name: string };
  /** Remaining seconds at `now` by the server's clock (0 once due; never negative). */
  remainingSec: number;
}

/** The timers list, with the server's clock so a device can correct its own. */
export interface TimerListDto {
  now: string;
  items: TimerDto[];
}

export interface TimerResultDto {
  now: string;
  timer: TimerDto;
}

type Clocked = Pick<TimerDto, "durationSec" | "elapsedSec" | "runningSince" | "state">;

/** Seconds run so far at a moment: the earlier runs plus the current one. */
export function timerElapsedSec(t: Clocked, nowMs: number): number {
  const running = t.state === "running" && t.runningSince ? Math.max(0, (nowMs - Date.parse(t.runningSince)) / 1000) : 0;
  return t.elapsedSec + running;
}

/** Seconds left at a moment (negative once overdue: how long the step has run past its time). */
export function timerLeftSec(t: Clocked, nowMs: number): number {
  return t.durationSec - timerElapsedSec(t, nowMs);
}
