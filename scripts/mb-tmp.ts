import { MikroORM } from "@mikro-orm/postgresql";
import config from "../mikro-orm.config";
import { StudioSchema } from "../entities/studio";
import { LayerSchema, TrialSchema } from "../entities/trial";
import { loadLibrary } from "../lib/trials/dto";
const orm = await MikroORM.init({ ...config, clientUrl: "postgres://postgres@127.0.0.1:54329/undertone_load" });
const em0 = orm.em.fork();
const st = await em0.findOneOrFail(StudioSchema, { id: "776553cd-50cd-4485-85a6-0a010eeb699a" });
const [{ id: tid }] = await em0.getConnection().execute("select t.id from trials t where studio_id = ? and (select count(*) from layers l where l.trial_id = t.id) = 3 limit 1", [st.id]);
async function measure(name: string, fn: () => Promise<unknown>, n = 400) {
  for (let i = 0; i < 100; i++) await fn();
  const c0 = process.cpuUsage(); const t0 = performance.now();
  for (let i = 0; i < n; i++) await fn();
  const c = process.cpuUsage(c0); const t = performance.now() - t0;
  console.log(`${name}: cpu ${((c.user + c.system) / 1000 / n).toFixed(2)} ms/op, wall ${(t / n).toFixed(2)} ms/op`);
}
await measure("trial populate", () => orm.em.fork().findOne(TrialSchema, { id: tid, studio: st.id }, { populate: ["base", "copiedFrom", "author"] }));
await measure("trial plain", () => orm.em.fork().findOne(TrialSchema, { id: tid, studio: st.id }));
await measure("layers", () => orm.em.fork().find(LayerSchema, { trial: tid }, { orderBy: { position: "asc" } }));
const layers = await orm.em.fork().find(LayerSchema, { trial: tid });
await measure("library", () => loadLibrary(orm.em.fork(), st.id, layers.flatMap((l) => l.dyes)));
await measure("raw trial row", () => orm.em.fork().getConnection().execute("select * from trials where id = ? and studio_id = ?", [tid, st.id]));
await measure("raw layers", () => orm.em.fork().getConnection().execute("select * from layers where trial_id = ? order by position", [tid]));
const em = orm.em.fork();
const [trow] = await em.getConnection().execute("select * from trials where id = ?", [tid]);
const lrows = await em.getConnection().execute("select * from layers where trial_id = ? order by position", [tid]);
await measure("map trial", async () => orm.em.fork().map(TrialSchema, trow));
await measure("map 3 layers", async () => { const e = orm.em.fork(); return lrows.map((r: any) => e.map(LayerSchema, r)); });
await orm.close();
