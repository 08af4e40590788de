import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { fitDyeProfiles, profileToJson, type DyeProfile, type DyeProfileJson } from "@/colour";
import { DyeProfileSchema, DyeSchema, type Studio } from "@/entities";
import { studioDyeings } from "./dyeings";

export interface ProfileDto {
  id: string;
  dyeId: string;
  dyeName: string;
  displayHex: string | null;
  fibreClass: string;
  nDyeings: number;
  meanDe00: number;
  maxDe00: number;
  modelVersion: number;
  fittedAt: string;
  profile: DyeProfileJson;
}

export async function listProfiles(em: EntityManager, studio: Studio): Promise<ProfileDto[]> {
  const list = await em.find(DyeProfileSchema, { studio }, { populate: ["dye"], orderBy: { fibreClass: "asc" } });
  return list
    .map((p) => {
      const dye = p.dye.getEntity();
      return {
        id: p.id,
        dyeId: dye.id,
        dyeName: dye.name,
        displayHex: dye.displayHex ?? null,
        fibreClass: p.fibreClass,
        nDyeings: p.nDyeings,
        meanDe00: p.meanDe00,
        maxDe00: p.maxDe00,
        modelVersion: p.modelVersion,
        fittedAt: p.fittedAt.toISOString(),
        profile: p.profile as unknown as DyeProfileJson,
      };
    })
    .sort((a, b) => a.dyeName.localeCompare(b.dyeName) || a.fibreClass.localeCompare(b.fibreClass));
}

export interface RefitResult {
  fibreClass: string;
  ok: boolean;
  message?: string;
  dyes: number;
  dyeings: number;
}

/**
 * Fits every dye's profile again from the studio's own dyeings, per fibre class, and stores them
 * with a higher model version. Dyes that no longer appear keep their last profile.
 */
export async function refitProfiles(em: EntityManager, studio: Studio): Promise<RefitResult[]> {
  const dyeings = await studioDyeings(em, studio);
  const classes = [...new Set(dyeings.map((d) => d.fibreClass))];
  const results: RefitResult[] = [];
  const fitted: { fibreClass: string; profiles: DyeProfile[] }[] = [];
  for (const fibreClass of classes) {
    const set = dyeings.filter((d) => d.fibreClass === fibreClass);
    const fit = fitDyeProfiles(set, { fibre: fibreClass });
    if (!fit.ok) {
      results.push({ fibreClass, ok: false, message: fit.message, dyes: 0, dyeings: set.length });
      continue;
    }
    fitted.push({ fibreClass, profiles: fit.profiles });
    results.push({ fibreClass, ok: true, dyes: fit.profiles.length, dyeings: set.length });
  }
  // Two refits of one studio at once would both read version n and both write n + 1 (or both
  // insert a first profile and one fail on the unique key): the writes take a per-studio lock,
  // so the second waits, reads what the first stored and counts on from there.
  await em.transactional(async (tx) => {
    await tx.execute("select pg_advisory_xact_lock(hashtext(?))", [`refit:${studio.id}`]);
    for (const { fibreClass, profiles } of fitted) {
      const dyes = await tx.find(DyeSchema, { studio: studio.id, id: { $in: profiles.map((p) => p.dyeId) } });
      const known = new Set(dyes.map((d) => d.id));
      for (const p of profiles.filter((x) => known.has(x.dyeId))) {
        const existing = await tx.findOne(DyeProfileSchema, { studio: studio.id, dye: p.dyeId, fibreClass }, { refresh: true });
        const values = {
          profile: profileToJson(p) as unknown as Record<string, unknown>,
          nDyeings: p.quality.n,
          meanDe00: p.quality.meanDE00,
          maxDe00: p.quality.maxDE00,
          fittedAt: new Date(),
        };
        if (existing) tx.assign(existing, { ...values, modelVersion: existing.modelVersion + 1 });
        else tx.create(DyeProfileSchema, { studio: studio.id, dye: p.dyeId, fibreClass, ...values });
      }
    }
  });
  return results;
}
