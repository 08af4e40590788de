// npm run seed – loads the invented demo studio; safe to run again (finds what exists).
import { MikroORM } from "@mikro-orm/postgresql";
import config from "../mikro-orm.config";
import { seedCards } from "./seed/cards";
import { seedComments } from "./seed/comments";
import { seedLibrary } from "./seed/library";
import { seedStudio } from "./seed/studio";
import { seedTrials } from "./seed/trials";

const orm = await MikroORM.init(config);
try {
  const em = orm.em.fork();
  const demo = await em.transactional(async (tx) => {
    const d = await seedStudio(tx);
    const library = await seedLibrary(tx, d.studio);
    await seedTrials(tx, d.studio, d.users, library);
    await seedCards(tx, d.studio);
    await seedComments(tx, d.studio, d.users);
    return { ...d, library };
  });
  console.log(`Seeded ${demo.studio.name}.`);
} finally {
  await orm.close();
}
