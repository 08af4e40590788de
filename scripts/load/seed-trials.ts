// Bulk trials for the load check: fills the demo studio up to `target` trials in a few SQL
// statements (generate_series inside the database, no per-trial round trips). Each trial gets
// 1–4 layers with dyes from the studio's library; every other one a ready photo and a reading,
// so the colour search has thousands of colours to rank. Invented, repetitive data: titles are
// "<word> <word> no. N". Run again, it adds only what is missing.
import type { EntityManager } from "@mikro-orm/postgresql";
import { DEMO_STUDIO_NAME } from "../seed/studio";

const WORDS_A = ["Harbour", "Lichen", "Rust", "Kelp", "Slate", "Heather", "Ember", "Moss", "Driftwood", "Sea glass", "Peat", "Bramble", "Oyster", "Saffron", "Storm", "Fern"];
const WORDS_B = ["dip", "speckle", "overdye", "gradient", "immersion", "rub", "tonal", "kettle", "semi-solid", "variegated", "wash test"];
const TAGS = ["blue", "warm", "sock", "sample", "repeat", "tonal", "green", "neutral"];
const METHODS = ["immersion", "kettle", "dip", "hand-paint", "speckle", "dry", "other"];

const lit = (words: string[]) => `(array[${words.map((w) => `'${w.replace(/'/g, "''")}'`).join(",")}])`;

export interface LoadSeedResult {
  studioId: string;
  trials: number;
  added: number;
  layers: number;
  readings: number;
}

export async function seedLoadTrials(em: EntityManager, target: number): Promise<LoadSeedResult> {
  return em.transactional(async (tx) => {
    const [studio] = await tx.execute<{ id: string }[]>("select id from studios where name = ?", [DEMO_STUDIO_NAME]);
    if (!studio) throw new Error(`No "${DEMO_STUDIO_NAME}" in this database: run npm run seed first.`);
    const [{ n }] = await tx.execute<{ n: number }[]>("select count(*)::int as n from trials where studio_id = ?", [studio.id]);
    const add = Math.max(0, target - n);
    if (add > 0) {
      const S = studio.id;
      // One row per new trial with its number g; dropped at commit.
      await tx.execute(
        `create temp table load_new on commit drop as
         select gen_random_uuid() as id, g, now() - (g * interval '47 minutes') as at
         from generate_series(${n + 1}, ${n + add}) g`,
      );
      await tx.execute(
        `insert into trials (id, created_at, studio_id, author_id, title, base_id, fibre_weight_g, status, tags, notes, notes_text, updated_at, version)
         select x.id, x.at, ?, u.ids[1 + x.g % array_length(u.ids, 1)],
                ${lit(WORDS_A)}[1 + x.g % ${WORDS_A.length}] || ' ' || ${lit(WORDS_B)}[1 + (x.g / 5) % ${WORDS_B.length}] || ' no. ' || x.g,
                b.ids[1 + x.g % array_length(b.ids, 1)],
                50 + (x.g % 8) * 25,
                (array['planned', 'in-progress', 'done'])[1 + x.g % 3],
                jsonb_build_array(${lit(TAGS)}[1 + x.g % ${TAGS.length}]) ||
                  case when x.g % 4 = 0 then jsonb_build_array(${lit(TAGS)}[1 + (x.g / 4) % ${TAGS.length}]) else '[]'::jsonb end,
                null,
                'Batch ' || x.g || ': ' || ${lit(WORDS_A)}[1 + (x.g / 3) % ${WORDS_A.length}] || ' notes, rinse until clear.',
                x.at + interval '2 hours', 1
         from load_new x,
              (select array_agg(m.user_id order by m.role, m.user_id) as ids from memberships m where m.studio_id = ? and m.role in ('owner', 'dyer')) u,
              (select array_agg(id order by name) as ids from yarn_bases where studio_id = ?) b`,
        [S, S, S],
      );
      await tx.execute(
        `insert into layers (id, created_at, trial_id, position, method, dyes, acid, water_l, temperature_c, minutes, setting, rinse_note, observations, updated_at, version)
         select gen_random_uuid(), x.at, x.id, p, ${lit(METHODS)}[1 + (x.g + p) % ${METHODS.length}],
                jsonb_build_array(jsonb_build_object('dyeId', d.ids[1 + (x.g + p) % array_length(d.ids, 1)], 'stockId', null,
                  'dosPct', 0.25 + ((x.g + p) % 8) * 0.25, 'entered', jsonb_build_object('value', 0.25 + ((x.g + p) % 8) * 0.25, 'unit', 'dos')))
                || case when (x.g + p) % 3 = 0 then jsonb_build_array(jsonb_build_object('dyeId', d.ids[1 + (x.g + 2 * p + 1) % array_length(d.ids, 1)],
                  'stockId', null, 'dosPct', 0.1, 'entered', jsonb_build_object('value', 0.1, 'unit', 'dos'))) else '[]'::jsonb end,
                '{"kind":"vinegar","amount":30}', 4, 85, 30, '{"method":"simmer","minutes":10}', '', '', x.at, 1
         from load_new x
         cross join lateral generate_series(0, x.g % 4) p,
         (select array_agg(id order by name) as ids from dyes where studio_id = ?) d`,
        [S],
      );
      await tx.execute(
        `insert into photos (id, created_at, studio_id, trial_id, kind, uploaded_by_id, status, upload_key, master_key, web_key, thumb_key, width, height, bytes, original_type, confirmed_at)
         select x.id, x.at, ?, x.id, 'final', t.author_id, 'ready',
                'load/uploads/' || x.id, 'load/' || x.id || '/master.jpg', 'load/' || x.id || '/web.webp', 'load/' || x.id || '/thumb.webp',
                1600, 1200, 400000, 'image/jpeg', x.at
         from load_new x join trials t on t.id = x.id where x.g % 2 = 0`,
        [S],
      );
      // Colours spread over the gamut a dye studio sees (L* 15–90, a*, b* −50…50).
      await tx.execute(
        `insert into readings (id, created_at, studio_id, trial_id, photo_id, model_version, label, region, l, a, b, palette, created_by_id, updated_at)
         select gen_random_uuid(), x.at, ?, x.id, x.id, 1, 'skein',
                '{"x":400,"y":300,"width":200,"height":200}',
                15 + mod(x.g * 37.3, 75), -50 + mod(x.g * 53.7, 100), -50 + mod(x.g * 29.1, 100),
                jsonb_build_array(jsonb_build_object('L', 15 + mod(x.g * 37.3, 75), 'a', -50 + mod(x.g * 53.7, 100), 'b', -50 + mod(x.g * 29.1, 100), 'share', 1)),
                t.author_id, x.at
         from load_new x join trials t on t.id = x.id where x.g % 2 = 0`,
        [S],
      );
      // Photo ids above reuse the trial's id: one photo per trial, and no lookup needed.
    }
    const [c] = await tx.execute<{ trials: number; layers: number; readings: number }[]>(
      `select (select count(*)::int from trials where studio_id = ?) as trials,
              (select count(*)::int from layers l join trials t on t.id = l.trial_id where t.studio_id = ?) as layers,
              (select count(*)::int from readings where studio_id = ?) as readings`,
      [studio.id, studio.id, studio.id],
    );
    return { studioId: studio.id, added: add, ...c };
  });
}
