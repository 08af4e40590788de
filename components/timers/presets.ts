// The step timers a layer offers, from its setting step and bath time.

export interface TimerPreset {
  label: string;
  minutes: number;
}

const SETTING_WORDS = { simmer: "Simmer", steam: "Steam", microwave: "Microwave" } as const;
/** Usual lengths when the layer gives none [common practice]: steam 20–45 min, simmer/hold 30–45 min, short microwave bursts. */
const SETTING_DEFAULT_MIN = { simmer: 30, steam: 20, microwave: 2 } as const;

/** The timers a layer offers: its setting step first (or, without one, the hold in the bath), then a rest. */
export function presetsFor(layer: {
  setting: { method: "simmer" | "steam" | "microwave" | "none"; minutes?: number | null };
  minutes?: number | null;
}): TimerPreset[] {
  const s = layer.setting.method;
  const hold = { label: "Hold", minutes: layer.minutes || 30 };
  const rest = { label: "Rest", minutes: 5 };
  if (s === "none") return [hold, rest];
  return [{ label: SETTING_WORDS[s], minutes: layer.setting.minutes || SETTING_DEFAULT_MIN[s] }, rest, hold];
}
