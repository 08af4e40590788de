import type { Role } from "@/entities/studio";

// The one permission table: which studio roles may do what. Route handlers name a key from here.
export const permissions = {
  "studio.read": ["owner", "dyer", "guest"],
  "studio.update": ["owner"],
  "member.read": ["owner", "dyer", "guest"],
  "member.manage": ["owner"],
  "invitation.manage": ["owner"],
  "library.read": ["owner", "dyer", "guest"],
  "library.edit": ["owner", "dyer"],
  "library.delete": ["owner"],
  "trial.read": ["owner", "dyer", "guest"],
  "trial.edit": ["owner", "dyer"],
  "trial.delete": ["owner"],
  "timer.use": ["owner", "dyer"],
  "photo.read": ["owner", "dyer", "guest"],
  "photo.upload": ["owner", "dyer"],
  "card.edit": ["owner", "dyer"],
  "prediction.run": ["owner", "dyer"],
  "colourway.read": ["owner", "dyer", "guest"],
  "colourway.propose": ["owner", "dyer"],
  "colourway.approve": ["owner"],
  "lot.edit": ["owner", "dyer"],
  "comment.read": ["owner", "dyer", "guest"],
  "comment.write": ["owner", "dyer", "guest"],
  "comment.moderate": ["owner"],
  "follow.use": ["owner", "dyer", "guest"],
  "activity.read": ["owner", "dyer", "guest"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof permissions;

export function can(role: Role, permission: Permission): boolean {
  return (permissions[permission] as readonly Role[]).includes(role);
}
