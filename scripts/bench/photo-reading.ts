// Photo reading on a 12 MP JPEG: decode with sharp, calibrate from the card's patches sampled in the
// raw buffer, read one swatch region (colour + palette) — against sharp's bare decode of the same
// file. Goal: the whole reading within 1.5× the bare decode. Median of several runs after a few
// warm-up runs (a server reads many photos; the first readings also compile the code). Wall time
// and process CPU time are both shown: on a shared, loaded machine the CPU time is the steadier one.
import { loadavg } from "node:os";
import sharp from "sharp";
import { calibrateCard, patchGrid, samplePatch, type RawImage } from "../../colour/calibration";
import { deltaE00 } from "../../colour/difference";
import { readRegion } from "../../colour/swatch";
import { DEMO_CARD, renderPhoto } from "../../colour/synthetic";

const RUNS = 9, WARM_UP = 8;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const cpu = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

async function decode(jpeg: Buffer): Promise<RawImage> {
  const { data, info } = await sharp(jpeg).raw().toBuffer({ resolveWithObject: true });
  return { data, width: info.width, height: info.height, channels: info.channels };
}

export default async function bench() {
  const W = 4000, H = 3000;
  const rect = { x: 2200, y: 900, width: 1200, height: 1100 };
  let t = performance.now();
  const photo = renderPhoto({
    width: W, height: H, seed: 12,
    swatches: [{
      spec: { kind: "speckled", base: { L: 80, a: 4, b: 12 }, speckles: [{ lab: { L: 42, a: 50, b: 0 }, share: 0.15 }, { lab: { L: 48, a: -28, b: -8 }, share: 0.1 }] },
      rect, texture: { period: 28 },
    }],
  });
  const jpeg = await sharp(photo.data, { raw: { width: W, height: H, channels: 3 } }).jpeg({ quality: 90, chromaSubsampling: "4:2:0" }).toBuffer();
  console.log(`input: synthetic ${W}×${H} JPEG (quality 90, 4:2:0), ${(jpeg.length / 1e6).toFixed(1)} MB; rendered in ${((performance.now() - t) / 1000).toFixed(1)} s`);

  const inner = { x: rect.x + 20, y: rect.y + 20, width: rect.width - 40, height: rect.height - 40 };
  const places = patchGrid(photo.gridCorners, DEMO_CARD.rows, DEMO_CARD.cols);
  const wall = { bare: [] as number[], full: [] as number[], extra: [] as number[] };
  const proc = { bare: [] as number[], full: [] as number[], extra: [] as number[] };
  let last: { reading: ReturnType<typeof readRegion>; cal: ReturnType<typeof calibrateCard> } | null = null;
  for (let i = 0; i < WARM_UP + RUNS; i++) {
    let c = cpu();
    t = performance.now();
    await decode(jpeg);
    const b = performance.now() - t, cb = cpu() - c;

    c = cpu();
    t = performance.now();
    const image = await decode(jpeg);
    const t1 = performance.now(), c1 = cpu();
    const cal = calibrateCard(places.map((p, k) => ({ known: DEMO_CARD.patches[k].lab, ...samplePatch(image, p.rect) })));
    const reading = readRegion(image, inner, cal); // sampled in place: no copy of the region
    const t2 = performance.now(), c2 = cpu();
    if (i < WARM_UP) continue;
    wall.bare.push(b); wall.full.push(t2 - t); wall.extra.push(t2 - t1);
    proc.bare.push(cb); proc.full.push(c2 - c); proc.extra.push(c2 - c1);
    last = { reading, cal };
  }
  const line = (name: string, m: { bare: number[]; full: number[]; extra: number[] }) => {
    const d = median(m.bare), f = median(m.full), e = median(m.extra);
    console.log(`${name}: bare decode ${d.toFixed(0)} ms; decode + calibrate + read ${f.toFixed(0)} ms = ${(f / d).toFixed(2)}× (goal ≤ 1.5×); calibration + reading alone ${e.toFixed(0)} ms`);
  };
  console.log(`load average ${loadavg()[0].toFixed(1)} on this machine; medians of ${RUNS} runs after ${WARM_UP} warm-up runs`);
  line("wall time", wall);
  line("CPU time ", proc);
  console.log(`(24 card patches sampled in the raw buffer; ${last!.reading.pixelsSampled} of the swatch's ${inner.width * inner.height} pixels sampled)`);

  // The same calibration and reading repeated on one decoded image: the method's own cost, without
  // the garbage collection that each fresh 36 MB decode sets off in the next JavaScript to run.
  const image = await decode(jpeg);
  const again: number[] = [];
  for (let i = 0; i < 12; i++) {
    const c = cpu();
    readRegion(image, inner, calibrateCard(places.map((p, k) => ({ known: DEMO_CARD.patches[k].lab, ...samplePatch(image, p.rect) }))));
    if (i >= 3) again.push(cpu() - c);
  }
  console.log(`calibration + reading repeated on one decoded image: ${median(again).toFixed(0)} ms CPU (median of 9)`);

  const truth = photo.swatches[0];
  const { reading, cal } = last!;
  console.log(`calibration: ${cal.model}, leave-one-out ΔE00 mean ${cal.looMeanDe00.toFixed(2)}, max ${cal.looMaxDe00.toFixed(2)} (${cal.quality})`);
  const shares = truth.palette.map((tp) => {
    const found = reading.palette.reduce((b, p) => (deltaE00(p.lab, tp.lab) < deltaE00(b.lab, tp.lab) ? p : b));
    return `${tp.share.toFixed(3)}→${found.share.toFixed(3)} (ΔE00 ${deltaE00(found.lab, tp.lab).toFixed(2)})`;
  });
  console.log(`swatch palette, truth→read share: ${shares.join(", ")}; ${reading.palette.length} colours found`);
}
