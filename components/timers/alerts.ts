"use client";

// How a finished step gets the dyer's attention across the room: three short beeps made with
// Web Audio (no sound files), a vibration, and a browser notification when allowed.

let audio: AudioContext | null = null;

/**
 * Browsers only let a page make sound after a tap. Called from the tap that starts a timer, it
 * unlocks audio for later and asks (once) whether notifications may be shown.
 */
export function primeAlerts(): void {
  try {
    const Ctor = window.AudioContext ?? (window as unknown as { webkitAudioContext?: typeof AudioContext }).webkitAudioContext;
    if (Ctor) {
      audio ??= new Ctor();
      if (audio.state === "suspended") void audio.resume();
    }
  } catch {
    audio = null;
  }
  if ("Notification" in window && Notification.permission === "default") {
    void Notification.requestPermission().catch(() => undefined);
  }
}

function beep(): void {
  if (!audio) return;
  const t0 = audio.currentTime;
  for (let i = 0; i < 3; i++) {
    const osc = audio.createOscillator();
    const gain = audio.createGain();
    osc.type = "sine";
    osc.frequency.value = 880;
    const start = t0 + i * 0.35;
    // A short ramp at each end keeps the beep from clicking.
    gain.gain.setValueAtTime(0.0001, start);
    gain.gain.exponentialRampToValueAtTime(0.4, start + 0.02);
    gain.gain.exponentialRampToValueAtTime(0.0001, start + 0.22);
    osc.connect(gain).connect(audio.destination);
    osc.start(start);
    osc.stop(start + 0.25);
  }
}

/** Sound, vibration and a notification for a step whose time is up. Each part fails quietly. */
export function ringTimer(label: string, trialTitle: string, timerId: string): void {
  try {
    beep();
  } catch {
    /* no audio on this device */
  }
  try {
    navigator.vibrate?.([300, 150, 300, 150, 600]);
  } catch {
    /* no vibration motor */
  }
  try {
    if ("Notification" in window && Notification.permission === "granted") {
      new Notification(`${label}: time is up`, { body: trialTitle, tag: `timer-${timerId}` });
    }
  } catch {
    /* some phones only allow notifications from a service worker */
  }
}

const RUNG_KEY = "undertone.timers.rung";

/** Timers this device has already rung for, so a reload does not ring again. */
export function rungTimers(): Set<string> {
  try {
    return new Set(JSON.parse(localStorage.getItem(RUNG_KEY) ?? "[]") as string[]);
  } catch {
    return new Set();
  }
}

export function markRung(ids: Iterable<string>): void {
  try {
    localStorage.setItem(RUNG_KEY, JSON.stringify([...ids].slice(-50)));
  } catch {
    /* storage full or blocked: at worst it rings again after a reload */
  }
}
