import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import type { Studio } from "@/entities/studio";
import { LayerSchema, type StepTimer, StepTimerSchema, TrialSchema } from "@/entities/trial";
import { conflict, notFound } from "@/lib/errors";
import {
  type TimerAction,
  type TimerActionInput,
  type TimerDto,
  type TimerInput,
  type TimerListDto,
  type TimerResultDto,
  timerElapsedSec,
} from "@/lib/schemas/timer";

// Step timers live on the server with their start time, so a reload, a locked phone or a
// second device all see the same countdown. Every time is taken from the server's clock.

/** How many timers one studio may have going at once: a kitchen has only so many pots. */
export const MAX_ACTIVE_TIMERS = 12;

function timerDto(t: StepTimer, now: Date): TimerDto {
  const trial = t.trial.getEntity();
  const by = t.startedBy.getEntity();
  const dto: Omit<TimerDto, "remainingSec"> = {
    id: t.id,
    trialId: trial.id,
    trialTitle: trial.title,
    layerId: t.layer?.id ?? null,
    label: t.label,
    durationSec: t.durationSec,
    elapsedSec: t.elapsedSec,
    runningSince: t.runningSince?.toISOString() ?? null,
    state: t.state,
    finishedAt: t.finishedAt?.toISOString() ?? null,
    version: t.version,
    startedBy: { id: by.id, name: by.name },
  };
  return { ...dto, remainingSec: Math.max(0, dto.durationSec - timerElapsedSec(dto, now.getTime())) };
}

/**
 * The studio's running and paused timers, oldest first; with `trialId`, that trial's timers in
 * every state (its finished steps too), newest first.
 */
export async function listTimers(em: EntityManager, studio: Studio, opts: { trialId?: string } = {}): Promise<TimerListDto> {
  const now = new Date();
  const timers = opts.trialId
    ? await em.find(
        StepTimerSchema,
        { studio, trial: opts.trialId },
        { populate: ["trial", "startedBy"], orderBy: { createdAt: "desc" }, limit: 50 },
      )
    : await em.find(
        StepTimerSchema,
        { studio, state: { $in: ["running", "paused"] } },
        { populate: ["trial", "startedBy"], orderBy: { createdAt: "asc" } },
      );
  return { now: now.toISOString(), items: timers.map((t) => timerDto(t, now)) };
}

/** Starts a timer on a trial (and one of its layers) of this studio. */
export async function startTimer(em: EntityManager, studio: Studio, userId: string, input: TimerInput): Promise<TimerResultDto> {
  const trial = await em.findOne(TrialSchema, { id: input.trialId, studio });
  if (!trial) throw notFound("This trial");
  let layer = null;
  if (input.layerId) {
    layer = await em.findOne(LayerSchema, { id: input.layerId, trial });
    if (!layer) throw notFound("This layer");
  }
  const active = await em.count(StepTimerSchema, { studio, state: { $in: ["running", "paused"] } });
  if (active >= MAX_ACTIVE_TIMERS) {
    throw conflict(`This studio already has ${active} timers going. Finish or cancel one first.`);
  }
  const now = new Date();
  const timer = em.create(StepTimerSchema, {
    studio,
    trial,
    layer,
    startedBy: userId,
    label: input.label,
    durationSec: input.durationSec,
    elapsedSec: 0,
    runningSince: now,
    state: "running",
  });
  await em.flush();
  await em.populate(timer, ["trial", "startedBy"]);
  return { now: now.toISOString(), timer: timerDto(timer, now) };
}

const WHY_NOT: Record<TimerAction, string> = {
  pause: "Only a running timer can be paused.",
  resume: "Only a paused timer can be resumed.",
  finish: "This timer has already stopped.",
  cancel: "This timer has already stopped.",
};

/** Which states each action may start from. */
const FROM: Record<TimerAction, StepTimer["state"][]> = {
  pause: ["running"],
  resume: ["paused"],
  finish: ["running", "paused"],
  cancel: ["running", "paused"],
};

/** Applies pause / resume / finish / cancel with the server's clock; a stale version is a 409. */
export async function actOnTimer(
  em: EntityManager,
  studio: Studio,
  timerId: string,
  input: TimerActionInput,
): Promise<TimerResultDto> {
  const timer = await em.findOne(StepTimerSchema, { id: timerId, studio }, { populate: ["trial", "startedBy"] });
  if (!timer) throw notFound("This timer");
  if (timer.version !== input.version) {
    throw conflict("Someone changed this timer a moment ago (paused, resumed or stopped it). Look at it again, then try once more.");
  }
  if (!FROM[input.action].includes(timer.state)) throw conflict(WHY_NOT[input.action]);
  const now = new Date();
  // Bank the current run before any change of state.
  if (timer.state === "running" && timer.runningSince) {
    timer.elapsedSec += Math.max(0, (now.getTime() - timer.runningSince.getTime()) / 1000);
    timer.runningSince = null;
  }
  switch (input.action) {
    case "pause":
      timer.state = "paused";
      break;
    case "resume":
      timer.state = "running";
      timer.runningSince = now;
      break;
    case "finish":
    case "cancel":
      timer.state = input.action === "finish" ? "done" : "cancelled";
      timer.finishedAt = now;
      break;
  }
  await em.flush();
  return { now: now.toISOString(), timer: timerDto(timer, now) };
}
