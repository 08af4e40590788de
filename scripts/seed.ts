// npm run seed – loads the invented demo studio; safe to run again (finds what exists).
import { MikroORM } from "@mikro-orm/postgresql";
import config from "../mikro-orm.config";
import { seedCalibration } from "./seed/calibration";
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
    const card = await seedCards(tx, d.studio);
    await seedComments(tx, d.studio, d.users);
    return { ...d, library, card };
  });
  // Photos go to the bucket, so this part runs after the rows above are committed; a failure
  // part-way leaves what it made, and the next run starts again only when nothing was made.
  const em2 = orm.em.fork();
  const made = await em2.transactional((tx) => seedCalibration(tx, demo.studio, demo.users, demo.library, demo.card));
  if (made) console.log(`Seeded ${made} calibration and over-dye trials with photos, readings and fitted profiles.`);
  console.log(`Seeded ${demo.studio.name}.`);
} finally {
  await orm.close();
}
