// Every method takes its whole params object as its first argument, as on
// the wire, and answers as it does for the model and options. The two-bar
// truss's figures are checked by hand: bars from (0, 0) and (8, 0) to an
// apex at (4, 3) carrying 10 kN down, so sin θ = 3/5, each bar carries
// N = −P / (2 sin θ) = −8.333 kN over 5 m and the load path is
// Σ|N|·L = 2 × 8.333 × 5 = 83.33 kN·m (common practice).

import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';

import { Client, GussetError } from '../src/index.js';
import { binary } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';

const twoBar = {
  dimension: 2,
  units: { length: 'm', force: 'kN' },
  parameters: { h: 3 },
  materials: [{ id: 'steel', elastic_modulus: 2.1e8, tension_limit: 2.35e5, compression_limit: 2.35e5, mass_density: 7.85 }],
  sections: [{ id: 'tube', area: 0.002, second_moment: 3e-6 }],
  nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [8, 0] }, { id: 'C', at: [4, 'h'] }],
  members: [
    { id: 'AC', ends: ['A', 'C'], material: 'steel', section: 'tube' },
    { id: 'BC', ends: ['B', 'C'], material: 'steel', section: 'tube' },
  ],
  supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['x', 'y'] }],
  load_cases: [{ id: 'point', loads: [{ node: 'C', force: [0, -10] }] }],
};

const layout = {
  domain: { outline: [[0, 0], [4, 0], [4, 2], [0, 2]] },
  divisions: [4, 2],
  supports: [{ at: [0, 0], fix: ['x', 'y'] }, { at: [4, 0], fix: ['y'] }],
  cases: [{ id: 'point', loads: [{ at: [2, 0], force: [0, -10] }] }],
  tension_limit: 235,
  compression_limit: 235,
};

/** @param {() => Promise<any>} thunk */
async function outcome(thunk) {
  try {
    return await thunk();
  } catch (e) {
    if (e instanceof GussetError) return [e.constructor.name, e.message];
    throw e;
  }
}

describe('params object as the first argument', { skip }, () => {
  /** @type {Client} */
  let client;
  before(() => { client = new Client({ binary: bin }); });
  after(async () => { await client.close(); });

  /** @param {() => Promise<any>} byObject @param {() => Promise<any>} byArguments */
  async function both(byObject, byArguments) {
    const a = await outcome(byObject);
    const b = await outcome(byArguments);
    assert.deepEqual(a, b);
    return a;
  }

  test('solve', async () => {
    const r = await both(() => client.solve({ model: twoBar, cases: ['point'] }), () => client.solve(twoBar, { cases: ['point'] }));
    for (const n of r.cases[0].axial_forces) assert.ok(Math.abs(n + 10 / 1.2) < 1e-9, String(n));
  });

  test('options add to the params object', async () => {
    const r = await client.solve({ model: twoBar }, { cases: ['point'] });
    assert.deepEqual(r.cases.map((c) => c.id), ['point']);
  });

  test('reciprocate', async () => {
    await both(() => client.reciprocate({ model: twoBar, case: 'point' }), () => client.reciprocate(twoBar, { case: 'point' }));
  });

  test('loadPath', async () => {
    const r = await both(() => client.loadPath({ model: twoBar }), () => client.loadPath(twoBar));
    assert.ok(Math.abs(r.cases[0].load_path - 2 * (10 / 1.2) * 5) < 1e-6);
  });

  test('sweepParameter and sweep', async () => {
    const axis = { name: 'h', values: [2, 3, 4] };
    const r = await both(
      () => client.sweepParameter({ model: twoBar, parameters: axis, metrics: ['load_path'] }),
      () => client.sweepParameter(twoBar, axis, { metrics: ['load_path'] }),
    );
    assert.ok(Math.abs(r.steps[1].metrics.load_path - 2 * (10 / 1.2) * 5) < 1e-6);
    const streamed = await client.sweep({ model: twoBar, parameters: [axis] }, { metrics: ['load_path'] }).result();
    assert.deepEqual(streamed, r);
  });

  test('optimiseLayout', async () => {
    await both(() => client.optimiseLayout(layout), () => client.optimiseLayout({ ...layout }, {}));
  });

  test('modes', async () => {
    await both(() => client.modes({ model: twoBar, kind: 'vibration', count: 1 }), () => client.modes(twoBar, 'vibration', { count: 1 }));
  });

  test('findForm', async () => {
    await both(
      () => client.findForm({ model: twoBar, force_density: -2, case: 'point' }),
      () => client.findForm(twoBar, { force_density: -2, case: 'point' }),
    );
  });
});
