// npm run seed – loads the invented demo studio; safe to run again (finds what exists).
import { MikroORM } from "@mikro-orm/postgresql";
import config from "../mikro-orm.config";
import { seedStudio } from "./seed/studio";

const orm = await MikroORM.init(config);
try {
  const em = orm.em.fork();
  const demo = await em.transactional(async (tx) => {
    const d = await seedStudio(tx);
    return d;
  });
  console.log(`Seeded ${demo.studio.name}.`);
} finally {
  await orm.close();
}
