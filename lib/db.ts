import "server-only";
import { MikroORM, type EntityManager } from "@mikro-orm/postgresql";
import config from "@/mikro-orm.config";
import { env } from "./env";

// One ORM per process, cached on globalThis so hot reloads and route bundles share it.
const cache = globalThis as unknown as { __undertoneOrm?: Promise<MikroORM> };

export function getOrm(): Promise<MikroORM> {
  cache.__undertoneOrm ??= MikroORM.init({ ...config, clientUrl: env.DATABASE_URL }).catch((e) => {
    cache.__undertoneOrm = undefined;
    throw e;
  });
  return cache.__undertoneOrm;
}

/** A fresh EntityManager for one request or job. */
export async function getEm(): Promise<EntityManager> {
  return (await getOrm()).em.fork();
}
