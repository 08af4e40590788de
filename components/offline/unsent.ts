"use client";

import { ApiError } from "@/components/api";
import { localStore, useLocalStore } from "./local-store";
import type { WriteKind, WriteVars } from "./trial-writes";

// Changes the server refused after they were queued (someone else saved first: 409; or the server
// found a problem: 422). They are kept here, on this device, until the dyer applies them again or
// lets them go — never dropped silently.

export interface Unsent {
  id: string;
  /** A trial-page write (WriteKind), or "list:<kind>" for the trial list's own writes. */
  kind: WriteKind | `list:${string}`;
  vars: WriteVars;
  status: number;
  message: string;
  fields?: Record<string, string>;
  at: string;
}

const store = localStore<Unsent[]>("undertone.offline.unsent", []);
const EMPTY: Unsent[] = [];

export function recordUnsent(kind: Unsent["kind"], vars: WriteVars, e: Error): void {
  const status = e instanceof ApiError ? e.status : 0;
  const entry: Unsent = {
    id: Math.random().toString(36).slice(2, 10),
    kind,
    vars,
    status,
    message: e.message,
    fields: e instanceof ApiError ? e.fields : undefined,
    at: new Date().toISOString(),
  };
  store.set((all) => [...all, entry].slice(-50));
}

export function dismissUnsent(id: string): void {
  store.set((all) => all.filter((u) => u.id !== id));
}

export function clearUnsent(): void {
  store.set([]);
}

export function useUnsent(trialId?: string): Unsent[] {
  const all = useLocalStore(store, EMPTY);
  return trialId ? all.filter((u) => u.vars.trialId === trialId) : all;
}

const FIELD_WORDS: Record<string, string> = {
  title: "Title",
  status: "Status",
  tags: "Tags",
  fibreWeightG: "Fibre weight (g)",
  baseId: "Base",
  notes: "Notes",
  method: "Method",
  dyes: "Dyes",
  acid: "Acid",
  waterL: "Water (l)",
  temperatureC: "Temperature (°C)",
  minutes: "Minutes",
  setting: "Setting",
  rinseNote: "Rinse",
  bled: "Bled",
  coverage: "Coverage",
  gradient: "Gradient",
  observations: "Observations",
  layerIds: "Layer order",
};

function valueWords(key: string, v: unknown): string {
  if (v === null || v === undefined || v === "") return "—";
  if (key === "notes") return "your edited notes";
  if (key === "dyes" && Array.isArray(v)) {
    return v.map((d: { amount?: { value: number; unit: string } }) => (d.amount ? `${d.amount.value} ${d.amount.unit}` : "?")).join(", ");
  }
  if (key === "layerIds" && Array.isArray(v)) return `${v.length} layers in a new order`;
  if (key === "coverage" && typeof v === "number") return `${Math.round(v * 100)} %`;
  if (key === "bled" && typeof v === "boolean") return v ? "yes" : "no";
  if (Array.isArray(v)) return v.join(", ");
  if (typeof v === "object") {
    return Object.entries(v as Record<string, unknown>)
      .filter(([, x]) => x !== null && x !== undefined)
      .map(([k, x]) => `${k} ${Array.isArray(x) ? x.join("/") : String(x)}`)
      .join(", ");
  }
  return String(v);
}

/** The values a refused change carried, as lines a person can read and type in again. */
export function unsentValues(u: Unsent): { label: string; value: string }[] {
  const v = u.vars as unknown as Record<string, unknown>;
  const body = (v.patch ?? v.input ?? (v.layerIds ? { layerIds: v.layerIds } : {})) as Record<string, unknown>;
  return Object.entries(body)
    .filter(([, x]) => x !== undefined)
    .map(([k, x]) => ({ label: FIELD_WORDS[k] ?? k, value: valueWords(k, x) }));
}
