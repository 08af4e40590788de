// Photo confirmation on a 12 MP JPEG as the server does it: check and write the variants
// (oriented, metadata-free master, web and thumbnail), then a calibrated reading of one swatch
// from the master — against sharp's bare decode of the same file. Median of several runs.
import sharp from "sharp";
import { DEMO_CARD, renderPhoto } from "../../colour";
import { makeVariants } from "../../lib/photos/process";
import { readFromImage } from "../../lib/photos/measure";

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function time<T>(fn: () => Promise<T>): Promise<[number, T]> {
  const t = performance.now();
  const out = await fn();
  return [performance.now() - t, out];
}

export default async function bench() {
  const W = 4000, H = 3000;
  const photo = renderPhoto({
    width: W,
    height: H,
    seed: 11,
    swatches: [{ spec: { kind: "solid", lab: { L: 52, a: 28, b: -20 } }, rect: { x: 2300, y: 900, width: 1200, height: 1100 } }],
  });
  const jpeg = await sharp(photo.data, { raw: { width: W, height: H, channels: 3 } }).jpeg({ quality: 90 }).toBuffer();
  console.log(`input: ${W}×${H} JPEG, ${(jpeg.length / 1e6).toFixed(1)} MB`);
  const card = { rows: DEMO_CARD.rows, cols: DEMO_CARD.cols, patches: DEMO_CARD.patches.map((p) => ({ name: p.name, ...p.lab })) };
  const decode: number[] = [], confirm: number[] = [], reading: number[] = [];
  for (let i = 0; i < 5; i++) {
    decode.push((await time(() => sharp(jpeg).raw().toBuffer()))[0]);
    const [tc, v] = await time(() => makeVariants(jpeg));
    confirm.push(tc);
    reading.push((await time(() => readFromImage(v.master, card, photo.gridCorners, { x: 2400, y: 1000, width: 1000, height: 900 })))[0]);
  }
  const d = median(decode), c = median(confirm), r = median(reading);
  console.log(`sharp bare decode: ${d.toFixed(0)} ms (median of 5)`);
  console.log(`confirm (check + master + web + thumb): ${c.toFixed(0)} ms`);
  console.log(`calibrated reading + palette from the master: ${r.toFixed(0)} ms (${(r / d).toFixed(2)}× the bare decode; goal ≤ 1.5×)`);
  console.log(`photo confirm + variants + reading: ${(c + r).toFixed(0)} ms`);
}
