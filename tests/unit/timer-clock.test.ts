// Step-timer arithmetic shared by the server and the timer bar: time left from a start time and
// the banked seconds (never from counting ticks), the clock face, and the presets a layer offers.
import { describe, expect, it } from "vitest";
import { presetsFor } from "@/components/timers/presets";
import { formatClock } from "@/components/timers/use-now";
import { timerElapsedSec, timerLeftSec } from "@/lib/schemas/timer";

const T0 = Date.parse("2026-12-03T09:00:00Z");

describe("time left", () => {
  const running = { durationSec: 1200, elapsedSec: 300, runningSince: new Date(T0).toISOString(), state: "running" as const };

  it("adds the current run to the seconds banked before a pause", () => {
    expect(timerElapsedSec(running, T0 + 60_000)).toBe(360);
    expect(timerLeftSec(running, T0 + 60_000)).toBe(840);
  });

  it("goes below zero once a step runs past its time (the bar shows it as overdue)", () => {
    expect(timerLeftSec(running, T0 + 1_000_000)).toBe(-100);
  });

  it("does not count while paused, however late it is read", () => {
    const paused = { ...running, state: "paused" as const, runningSince: null };
    expect(timerLeftSec(paused, T0 + 9_999_000)).toBe(900);
  });

  it("ignores a device clock behind the start time rather than adding time", () => {
    expect(timerLeftSec(running, T0 - 5_000)).toBe(900);
  });
});

describe("the clock face", () => {
  it("rounds up while counting down and shows hours only when needed", () => {
    expect(formatClock(1200)).toBe("20:00");
    expect(formatClock(1199.2)).toBe("20:00");
    expect(formatClock(59)).toBe("0:59");
    expect(formatClock(4000)).toBe("1:06:40");
    expect(formatClock(-3)).toBe("0:00");
  });
});

describe("presets", () => {
  it("offers a steamed layer its steam first, then a rest and a hold", () => {
    expect(presetsFor({ setting: { method: "steam", minutes: 25 }, minutes: null })).toEqual([
      { label: "Steam", minutes: 25 },
      { label: "Rest", minutes: 5 },
      { label: "Hold", minutes: 30 },
    ]);
  });

  it("uses 20 minutes for a steam with no time written [common practice]", () => {
    expect(presetsFor({ setting: { method: "steam", minutes: null } })[0]).toEqual({ label: "Steam", minutes: 20 });
  });

  it("offers a bath layer without a setting step its hold first, for the bath's own time", () => {
    expect(presetsFor({ setting: { method: "none" }, minutes: 40 })).toEqual([
      { label: "Hold", minutes: 40 },
      { label: "Rest", minutes: 5 },
    ]);
  });
});
