"use client";

import { createContext, useContext } from "react";
import type { Permission } from "@/lib/auth/permissions";
import { permissions } from "@/lib/auth/permissions";

export interface StudioCtx {
  studioId: string;
  studioName: string;
  role: "owner" | "dyer" | "guest";
  userId: string;
}

const Ctx = createContext<StudioCtx | null>(null);

export function StudioProvider({ value, children }: { value: StudioCtx; children: React.ReactNode }) {
  return <Ctx.Provider value={value}>{children}</Ctx.Provider>;
}

export function useStudio(): StudioCtx {
  const v = useContext(Ctx);
  if (!v) throw new Error("useStudio outside a studio page");
  return v;
}

/** Whether the caller's role allows an action: hides controls; the server checks again. */
export function useCan(permission: Permission): boolean {
  const { role } = useStudio();
  return (permissions[permission] as readonly string[]).includes(role);
}
