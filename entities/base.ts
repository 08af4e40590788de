import { randomUUID } from "node:crypto";
import type { EntitySchemaProperty, Opt } from "@mikro-orm/core";

// Shared columns: a random UUID key and creation time, set by the ORM on insert.
export interface Base {
  id: string & Opt;
  createdAt: Date & Opt;
}

export const baseProperties = {
  id: { type: "uuid", primary: true, onCreate: () => randomUUID() },
  createdAt: { type: "datetime", onCreate: () => new Date() },
} satisfies Record<string, EntitySchemaProperty<unknown, unknown>>;
