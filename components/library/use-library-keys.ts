// Query keys for the studio's libraries, shared by the hooks so a change refreshes every view.
export const libraryKeys = {
  all: (studioId: string) => ["studios", studioId, "library"] as const,
  bases: (studioId: string, archived = false) => ["studios", studioId, "library", "bases", { archived }] as const,
  dyes: (studioId: string, archived = false) => ["studios", studioId, "library", "dyes", { archived }] as const,
  stocks: (studioId: string, archived = false) => ["studios", studioId, "library", "stocks", { archived }] as const,
  studio: (studioId: string) => ["studios", studioId] as const,
};
