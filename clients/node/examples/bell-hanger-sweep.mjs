// A sweep that prints its curve as it streams: how far should the bell hang?
//
// The scenario (our own invention): the ferry bell at Saltmarsh Landing, 6 kN
// with its yoke, hangs from two steel rods anchored 2.4 m apart under the
// landing stage's canopy beam. The rods meet at the yoke, a drop `depth`
// below the beam. A short drop makes the rods flat and their pull large; a
// long drop makes them long. We sweep the drop from 0.25 m to 3 m, print each
// step as soon as Gusset has computed it, with a bar as long as its load path
// (Σ|N|·L, the force times the length summed over the rods), and then the
// optimum that Gusset refines by Brent's method.
//
// Run from clients/node:
//
//     node examples/bell-hanger-sweep.mjs [OUTPUT_FOLDER]
//
// The steps (CSV) and the optimum (JSON) go into OUTPUT_FOLDER, else
// $GUSSET_EXAMPLES_OUT, else a new temporary folder.

import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

import { Client, GussetNotFound } from '../src/index.js';

const HALF_SPAN = 1.2; // m, from the middle to each anchor
const BELL = 6; // kN
const KNM_PER_MARK = 1; // each '#' of a bar stands for 1 kN·m of load path
const CAUTION = 'Preliminary design aid: a qualified engineer must check the design against the local codes and standards.';

// The model's geometry depends on the parameter "depth": the yoke sits at
// [0, "-depth"], an expression Gusset evaluates at every step of the sweep.
const MODEL = {
  dimension: 2,
  units: { length: 'm', force: 'kN' },
  parameters: { depth: 1 },
  materials: [{
    id: 'steel', elastic_modulus: 2.1e8, tension_limit: 2.35e5, compression_limit: 2.35e5,
    weight_density: 77, carbon_factor: 1.55,
  }],
  sections: [{ id: 'rod', area: 1e-4 }],
  nodes: [
    { id: 'west', at: [-HALF_SPAN, 0] },
    { id: 'east', at: [HALF_SPAN, 0] },
    { id: 'yoke', at: [0, '-depth'] },
  ],
  members: [
    { id: 'west-rod', ends: ['west', 'yoke'], material: 'steel', section: 'rod' },
    { id: 'east-rod', ends: ['east', 'yoke'], material: 'steel', section: 'rod' },
  ],
  supports: [{ node: 'west', fix: ['x', 'y'] }, { node: 'east', fix: ['x', 'y'] }],
  load_cases: [{ id: 'bell', loads: [{ node: 'yoke', force: [0, -BELL] }] }],
};

const pad = (value, width) => String(value).padStart(width);

async function main() {
  const folder = process.argv[2] || process.env.GUSSET_EXAMPLES_OUT || mkdtempSync(path.join(tmpdir(), 'gusset-bell-'));
  mkdirSync(folder, { recursive: true });
  const client = new Client();
  const steps = [];
  let result;
  try {
    const sweep = client.sweep(MODEL, { name: 'depth', from: 0.25, to: 3, count: 12 }, {
      metrics: ['load_path', 'volume', 'mass'],
      sizing: { shape: 'tube', diameter_to_thickness: 30 }, // rods only pull: no buckling
      objective: { metric: 'load_path', goal: 'minimise', tolerance: 1e-9 },
    });
    console.log('step  depth (m)  load path (kN·m)');
    for await (const step of sweep) { // each step arrives as soon as it is computed, maybe out of order
      const [depth] = step.values;
      const z = step.metrics.load_path;
      const bar = '#'.repeat(Math.round(z / KNM_PER_MARK));
      console.log(`${pad(step.index, 4)}  ${pad(depth.toFixed(2), 9)}  ${pad(z.toFixed(2), 16)}  ${bar}`);
      steps.push(step);
    }
    result = await sweep.result(); // the final answer, after the last step
  } finally {
    await client.close();
  }
  const best = result.refinement;
  const [depth] = best.values;
  const { load_path: z, volume, mass } = best.metrics;
  console.log(`Least load path at depth ${depth.toFixed(4)} m: ${z.toFixed(3)} kN·m, ` +
    `${(volume * 1e6).toFixed(2)} cm³ of steel (${mass.toFixed(3)} kg), after ${best.evaluations} evaluations.`);
  console.log(`The rods then lean at ${(Math.atan2(depth, HALF_SPAN) * 180 / Math.PI).toFixed(1)}° from the horizontal.`);

  steps.sort((p, q) => p.index - q.index);
  const lines = ['index,depth_m,load_path_kNm,volume_m3,mass_kg'];
  for (const s of steps) lines.push([s.index, s.values[0], s.metrics.load_path, s.metrics.volume, s.metrics.mass].join(','));
  writeFileSync(path.join(folder, 'bell-sweep.csv'), lines.join('\n') + '\n');
  writeFileSync(path.join(folder, 'bell-optimum.json'), JSON.stringify(best, null, 2) + '\n');
  console.log('steps and optimum:', folder);
  console.log(CAUTION);
}

main().catch((err) => {
  console.error(err instanceof GussetNotFound ? err.message : err);
  process.exitCode = 1;
});
