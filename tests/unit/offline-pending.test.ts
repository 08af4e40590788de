// Changes waiting to be sent: how they are laid over the last server copy of a trial, and how an
// edit made before this device's previous edit was answered finds the version to send.
import { beforeAll, describe, expect, it } from "vitest";
import type { LayerDto, TrialDto } from "@/lib/trials/types";

// A localStorage for the browser-only stores (this project runs unit tests in node).
const mem = new Map<string, string>();
Object.assign(globalThis, {
  window: globalThis,
  localStorage: {
    getItem: (k: string) => mem.get(k) ?? null,
    setItem: (k: string, v: string) => void mem.set(k, v),
    removeItem: (k: string) => void mem.delete(k),
  },
});

let applyPending: typeof import("@/components/offline/pending-view").applyPending;
let writes: typeof import("@/components/offline/trial-writes");
beforeAll(async () => {
  ({ applyPending } = await import("@/components/offline/pending-view"));
  writes = await import("@/components/offline/trial-writes");
});

function layer(id: string, position: number, extra: Partial<LayerDto> = {}): LayerDto {
  return {
    id, position, version: 1, method: "immersion", dyes: [], acid: { kind: "vinegar", amount: 40, ph: null },
    waterL: 3, liquorRatio: 30, temperatureC: 90, minutes: 30, setting: { method: "none", minutes: null },
    rinseNote: "", bled: null, coverage: null, gradient: null, observations: "", cautions: [], ...extra,
  };
}

const trial: TrialDto = {
  id: "t1", title: "Moss", status: "planned", tags: [], fibreWeightG: 100, notes: null, createdAt: "", updatedAt: "",
  version: 4, copiedFromId: null, author: { id: "u", name: "Ivo" }, base: null, warnings: [],
  layers: [layer("a", 0), layer("b", 1, { method: "dry" })],
};

const common = { studioId: "s", trialId: "t1" };
let n = 0;
const w = (kind: string, vars: object) => ({ mutationId: ++n, kind, vars: { ...common, label: kind, ...vars }, paused: true, submittedAt: n }) as never;

describe("applyPending", () => {
  it("shows the server copy untouched when nothing waits", () => {
    const v = applyPending(trial, []);
    expect(v.trial.layers.map((l) => l.id)).toEqual(["a", "b"]);
    expect(v.trialWaiting).toBe(false);
    expect(v.waitingLayers.size).toBe(0);
  });

  it("lays waiting edits over the server copy in the order they were made", () => {
    const v = applyPending(trial, [
      w("patchLayer", { layerId: "a", baseVersion: 1, patch: { observations: "first" } }),
      w("patchLayer", { layerId: "a", baseVersion: 1, patch: { observations: "second", acid: { kind: "citric", amount: 4 } } }),
      w("patchTrial", { baseVersion: 4, patch: { status: "done", tags: ["dip"] } }),
    ]);
    expect(v.trial.layers[0].observations).toBe("second");
    expect(v.trial.layers[0].acid).toEqual({ kind: "citric", amount: 4, ph: null });
    expect(v.trial.status).toBe("done");
    expect(v.trial.tags).toEqual(["dip"]);
    expect([...v.waitingLayers]).toEqual(["a"]);
    expect(v.trialWaiting).toBe(true);
    // The server copy itself is never changed.
    expect(trial.layers[0].observations).toBe("");
    expect(trial.status).toBe("planned");
  });

  it("adds, duplicates, reorders and deletes layers, numbering positions from 0", () => {
    const added = layer("pending-new", 9, { method: "speckle" });
    const v = applyPending(trial, [
      w("addLayer", { input: { method: "speckle" }, preview: added }),
      w("duplicateLayer", { layerId: "a", tempId: "pending-copy" }),
      w("reorderLayers", { layerIds: ["pending-new", "a", "pending-copy", "b"] }),
      w("deleteLayer", { layerId: "b" }),
    ]);
    expect(v.trial.layers.map((l) => l.id)).toEqual(["pending-new", "a", "pending-copy"]);
    expect(v.trial.layers.map((l) => l.position)).toEqual([0, 1, 2]);
    expect(v.trial.layers[2].method).toBe("immersion");
    expect([...v.waitingLayers].sort()).toEqual(["pending-copy", "pending-new"]);
  });
});

describe("version chains", () => {
  it("sends a second queued edit with the version the first one produced, and no further", () => {
    expect(writes.resolveVersion("layer-x", 3)).toBe(3);
    // The server answered the first edit (3 → 4), then the second (4 → 5).
    writes.recordVersion("layer-x", 3, 4);
    writes.recordVersion("layer-x", 4, 5);
    expect(writes.resolveVersion("layer-x", 3)).toBe(5);
    expect(writes.resolveVersion("layer-x", 4)).toBe(5);
    // A version this device did not move itself is sent as it is: someone else's change still answers 409.
    expect(writes.resolveVersion("layer-x", 6)).toBe(6);
    expect(writes.resolveVersion("layer-y", 3)).toBe(3);
    // Kept on the device for after a reload.
    expect(JSON.parse(localStorage.getItem("undertone.offline.versions")!)).toEqual({ "layer-x": { 3: 4, 4: 5 } });
  });

  it("forgets every chain when the device changes hands", () => {
    writes.recordVersion("trial-q", 1, 2);
    writes.forgetOfflineState();
    expect(writes.resolveVersion("trial-q", 1)).toBe(1);
  });
});
