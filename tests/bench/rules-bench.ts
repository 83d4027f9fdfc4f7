/**
 * Rules benchmark: evaluateSite on a generated 5,000-device site, compared with
 * a bare loop that only sums the devices' watts over the same array.
 *
 *   npx tsx tests/bench/rules-bench.ts
 */
import { evaluateSite, parseSite, type Site, type SiteEvaluation, type SiteInput } from '../../survey/index';

const DEVICE_COUNT = 5000;

/** Small deterministic PRNG (mulberry32) so every run benchmarks the same site. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A deterministic site with `n` devices of every kind and input, enough switches and some batteries. */
export function generateBenchSite(n = DEVICE_COUNT, seed = 20240611): Site {
  const r = rng(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
  const rooms = Array.from({ length: 60 }, (_, i) => ({ id: `rm-${i}`, name: `Room ${i}`, floorId: `fl-${i % 3}` }));
  const switches = Array.from({ length: 160 }, (_, i) => ({
    kind: 'poe_switch' as const, id: `sw-${i}`, name: `Switch ${i}`, roomId: 'rm-0',
    poeType: (2 + (i % 3)) as 2 | 3 | 4, budgetW: 370 + 10 * (i % 5), poePorts: 24, ownDrawW: 20, supplyEfficiency: 0.88,
  }));
  const injectors = Array.from({ length: 20 }, (_, i) => ({
    kind: 'injector' as const, id: `inj-${i}`, name: `Injector ${i}`, poeType: 4 as const, ports: 1,
  }));
  const outlets = Array.from({ length: 10 }, (_, i) => ({ kind: 'outlet' as const, id: `out-${i}`, name: `Outlet ${i}` }));
  const batteries = Array.from({ length: 10 }, (_, i) => ({
    id: `ups-${i}`, name: `Battery ${i}`, capacity: { by: 'wh' as const, wh: 1500 },
    feeds: [`sw-${i * 2}`, `sw-${i * 2 + 1}`, `out-${i}`], otherLoads: [{ name: 'Router', watts: 10 }],
  }));
  const kinds = ['access_point', 'camera', 'doorbell', 'hub', 'small_computer', 'compact_switch', 'other'] as const;
  const devices: SiteInput['devices'] = [];
  for (let i = 0; i < n; i++) {
    const kind = pick(kinds);
    const x = r();
    let input: SiteInput['devices'][number]['input'];
    let power: SiteInput['devices'][number]['power'];
    if (x < 0.45) {
      const cls = pick([1, 2, 3, 4, 4, 5, 6, 7, 8] as const);
      input = { type: 'poe', class: cls };
      power = { by: 'watts', watts: Math.max(1, [3, 6, 12, 25, 38, 50, 60, 70][Math.max(0, cls - 1)] * (0.5 + r() * 0.5)) };
    } else if (x < 0.65) {
      const size = pick([[5.5, 2.1], [5.5, 2.5], [3.5, 1.35], [5.5, 3.3]] as const);
      input = { type: 'dc_barrel', outerMm: size[0], innerMm: size[1], polarity: pick(['centre_positive', 'centre_negative', 'unknown'] as const), volts: 12 };
      power = { by: 'adapter', volts: 12, amps: pick([0.5, 1, 1.5, 2, 3]) };
    } else if (x < 0.75) {
      input = { type: pick(['micro_usb', 'usb_c'] as const) };
      power = { by: 'watts', watts: 1 + r() * 14 };
    } else if (x < 0.82) {
      input = { type: 'terminal_block', volts: pick([12, 24, 16]), current: pick(['dc', 'ac'] as const) };
      power = { by: 'watts', watts: 2 + r() * 10, typical: true };
    } else if (x < 0.9) {
      input = { type: 'ac_plug' };
      power = { by: 'watts', watts: 5 + r() * 40 };
    } else {
      input = { type: 'passive_poe', volts: pick([24, 48]) };
      power = { by: 'watts', watts: 3 + r() * 10 };
    }
    const hasRun = r() < 0.92;
    devices.push({
      id: `dev-${i}`, kind, name: `Device ${i}`, roomId: pick(rooms).id,
      mount: pick(['ceiling', 'high_wall', 'low_wall', 'soffit', 'shelf', 'outdoor_wall'] as const),
      power, input,
      mustStayUp: r() < 0.3,
      outdoor: r() < 0.2,
      ...(r() < 0.8 ? { outletDistanceM: r() * 6 } : {}),
      cableAccess: pick(['open_attic', 'drop_ceiling', 'unfinished_basement', 'finished_no_access', 'exterior'] as const),
      ...(hasRun ? {
        run: {
          lengthM: 3 + r() * 105,
          category: pick(['cat5e', 'cat6', 'cat6a'] as const),
          cca: r() < 0.03,
          ...(r() < 0.5 ? { gauge: pick([22, 23, 24, 26] as const) } : {}),
        },
      } : {}),
      ...(input.type === 'passive_poe' && r() < 0.5 ? { sourceId: `out-${i % 10}` } : {}),
    });
  }
  const input: SiteInput = {
    id: 'bench', name: 'Generated benchmark site',
    floors: [0, 1, 2].map((i) => ({ id: `fl-${i}`, name: `Floor ${i}`, level: i - 1 })),
    rooms, closetRoomId: 'rm-0',
    powerSources: [...switches, ...injectors, ...outlets],
    batteries, devices,
  };
  const parsed = parseSite(input);
  if (!parsed.ok) throw new Error(`bench site invalid: ${parsed.errors.slice(0, 3).map((e) => `${e.path}: ${e.message}`).join('; ')}`);
  return parsed.value;
}

function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** The baseline: only sum the devices' watts. */
function sumWatts(site: Site): number {
  let total = 0;
  const ds = site.devices;
  for (let i = 0; i < ds.length; i++) {
    const p = ds[i].power;
    total += p.by === 'watts' ? p.watts : p.volts * p.amps;
  }
  return total;
}

/** Everything a reader of the evaluation can ask for, so that every lazily written record and word is made. */
function readEverything(ev: SiteEvaluation): number {
  let n = 0;
  for (const d of ev.devices) n += d.reasons.join('').length + d.warnings.length + (d.cable?.problems.length ?? 0);
  for (const w of ev.warnings) n += w.message.length;
  n += ev.cableRuns.length + ev.outage.devices.length + ev.assignment.placements.length + ev.assignment.unassigned.length;
  for (const s of ev.switches) n += s.rows.length + s.reasons.length + s.suggestions.length;
  return n;
}

/**
 * Measure in this process. `npm run bench` runs this in a fresh process on the bundled code
 * (see `runRulesBench`), the way the rules ship in the server and the app.
 */
export function measureRules(): Record<string, number | string> {
  const site = generateBenchSite();
  const n = site.devices.length;

  // Warm up both paths until the optimising compiler is done with them (the rules' figures
  // settle after about 25 evaluations on this site), then time repetitions and take medians.
  let sink = 0;
  for (let i = 0; i < 40; i++) sink += evaluateSite(site).summary.deviceCount;
  for (let i = 0; i < 2000; i++) sink += sumWatts(site);

  const reps = 31;
  const evalTimes: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now();
    const ev = evaluateSite(site);
    const t1 = performance.now();
    sink += ev.summary.poeWatts.reservedW;
    evalTimes.push(t1 - t0);
  }
  // Reading every device's record and words as well (what the plan screen and the report do).
  for (let i = 0; i < 5; i++) sink += readEverything(evaluateSite(site));
  const readTimes: number[] = [];
  for (let i = 0; i < 11; i++) {
    const t0 = performance.now();
    sink += readEverything(evaluateSite(site));
    readTimes.push(performance.now() - t0);
  }
  // The bare loop is too quick to time once; each sample times `inner` passes over the array.
  const inner = 500;
  const loopTimes: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now();
    let acc = 0;
    for (let k = 0; k < inner; k++) acc += sumWatts(site);
    const t1 = performance.now();
    sink += acc;
    loopTimes.push((t1 - t0) / inner);
  }

  const usPerDevice = (median(evalTimes) * 1000) / n;
  const readUsPerDevice = (median(readTimes) * 1000) / n;
  const loopUsPerDevice = (median(loopTimes) * 1000) / n;
  const ratio = usPerDevice / loopUsPerDevice;
  return {
    devices: n,
    repetitions: reps,
    evaluateSiteMedianMs: Number(median(evalTimes).toFixed(3)),
    evaluateSiteUsPerDevice: Number(usPerDevice.toFixed(4)),
    bareLoopUsPerDevice: Number(loopUsPerDevice.toFixed(6)),
    ratio: Number(ratio.toFixed(1)),
    target: 'ratio < 20',
    meetsTarget: ratio < 20 ? 'yes' : 'no',
    // Not a target: the same evaluation with every record and sentence read as well.
    withEverythingReadUsPerDevice: Number(readUsPerDevice.toFixed(4)),
    withEverythingReadRatio: Number((readUsPerDevice / loopUsPerDevice).toFixed(1)),
    // Printing the sink keeps every timed result observable, so nothing is optimised away.
    checksum: Number(sink.toFixed(0)),
  };
}

/** Bundle this file with esbuild and measure it in a fresh Node process. */
export async function runRulesBench(): Promise<{ name: string; figures: Record<string, number | string> }> {
  const { build } = await import('esbuild');
  const { execFileSync } = await import('node:child_process');
  const { mkdtempSync, rmSync } = await import('node:fs');
  const { tmpdir } = await import('node:os');
  const path = await import('node:path');
  const dir = mkdtempSync(path.join(tmpdir(), 'dropwise-rules-bench-'));
  try {
    const outfile = path.join(dir, 'rules-bench.mjs');
    await build({
      stdin: {
        contents: `import { measureRules } from ${JSON.stringify(path.resolve(__dirname, 'rules-bench.ts'))};\nconsole.log(JSON.stringify(measureRules()));`,
        resolveDir: __dirname,
        loader: 'ts',
      },
      bundle: true, platform: 'node', format: 'esm', target: 'node20', outfile, logLevel: 'warning',
    });
    const out = execFileSync(process.execPath, [outfile], { encoding: 'utf8' });
    return { name: 'rules: evaluateSite, 5,000 devices (bundled as shipped, own process)', figures: JSON.parse(out.trim().split('\n').pop()!) };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const invokedDirectly = typeof process !== 'undefined' && /rules-bench\.ts$/.test(process.argv[1] ?? '');
if (invokedDirectly) {
  runRulesBench().then((r) => {
    console.log(r.name);
    for (const [k, v] of Object.entries(r.figures)) console.log(`  ${k}: ${v}`);
  });
}
