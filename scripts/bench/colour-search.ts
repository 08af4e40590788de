// Find by colour over 100 000 stored readings: nearestReadings (index prefilter + exact ΔE00 with a
// proven bound) for 50 random targets, on a throwaway studio made with SQL and deleted afterwards.
import { getEm, getOrm } from "../../lib/db";
import { nearestReadings } from "../../lib/learning/colour-search";

const N = 100_000;
const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))];

export default async function bench() {
  const em = await getEm();
  const db = em.getConnection();
  const [studio] = await db.execute<{ id: string }[]>(`insert into studios (id, created_at, name) values (gen_random_uuid(), now(), 'Bench studio') returning id`);
  const [user] = await db.execute<{ id: string }[]>(
    `insert into users (id, created_at, email, name) values (gen_random_uuid(), now(), 'bench-' || gen_random_uuid() || '@example.invalid', 'Bench') returning id`,
  );
  try {
    const [trial] = await db.execute<{ id: string }[]>(
      `insert into trials (id, created_at, studio_id, author_id, title, fibre_weight_g, updated_at) values (gen_random_uuid(), now(), ?, ?, 'Bench trial', 100, now()) returning id`,
      [studio.id, user.id],
    );
    const [photo] = await db.execute<{ id: string }[]>(
      `insert into photos (id, created_at, studio_id, trial_id, kind, uploaded_by_id, status, upload_key)
       values (gen_random_uuid(), now(), ?, ?, 'final', ?, 'ready', 'bench/none') returning id`,
      [studio.id, trial.id, user.id],
    );
    // Readings spread over the CIELAB space (setseed makes the set the same each run).
    await db.execute(`select setseed(0.42)`);
    const t0 = performance.now();
    await db.execute(
      `insert into readings (id, created_at, updated_at, studio_id, trial_id, photo_id, model_version, label, region, l, a, b, palette, created_by_id)
       select gen_random_uuid(), now(), now(), ?, ?, ?, 1, '', '{}', random() * 100, random() * 200 - 100, random() * 200 - 100, '[]', ?
       from generate_series(1, ?)`,
      [studio.id, trial.id, photo.id, user.id, N],
    );
    await db.execute(`analyze readings`);
    console.log(`inserted ${N.toLocaleString("en")} readings in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    let seed = 99;
    const rnd = () => (seed = (seed * 1664525 + 1013904223) >>> 0) / 2 ** 32;
    for (let i = 0; i < 5; i++) await nearestReadings(em, studio.id, { L: 50, a: 0, b: 0 }, 10); // warm-up
    const times: number[] = [];
    for (let i = 0; i < 50; i++) {
      const target = { L: 10 + rnd() * 85, a: rnd() * 120 - 60, b: rnd() * 120 - 60 };
      const t = performance.now();
      const found = await nearestReadings(em, studio.id, target, 10);
      times.push(performance.now() - t);
      if (found.length !== 10) throw new Error(`expected 10 matches, got ${found.length}`);
    }
    console.log(`nearest 10 of ${N.toLocaleString("en")} readings: median ${pct(times, 0.5).toFixed(1)} ms, p95 ${pct(times, 0.95).toFixed(1)} ms (50 targets; goal ≤ 30 ms median)`);
  } finally {
    for (const t of ["readings", "photos", "trials"]) await db.execute(`delete from ${t} where studio_id = ?`, [studio.id]);
    await db.execute(`delete from studios where id = ?`, [studio.id]);
    await db.execute(`delete from users where id = ?`, [user.id]);
    await (await getOrm()).close();
  }
}
