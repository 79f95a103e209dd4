// Inclined supports and area loads through the real binary.
//
// The triangle A(0,0), B(4,0), C(2,2), pinned at A, B on a roller on a 30°
// incline, 12 kN down at C: moments about A give the roller's normal reaction
// N = 6/cos 30° = 6.928203 kN, globally (−6 tan 30°, 6) (rigid-body statics
// with a smooth inclined support, as in R. C. Hibbeler, Engineering
// Mechanics: Statics, from memory). A 6 × 4 panel pitched at atan(3/4) under
// snow of 0.8 per plan area totals 0.8 × 24 = 19.2 kN, a quarter at each
// pinned corner (statics).

import assert from 'node:assert/strict';
import { test } from 'node:test';

import { Client, InvalidModel, areaLoad, inclinedSupport, localReactions } from '../src/index.js';
import { binary } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const close = (got, want, tol) => assert.ok(Math.abs(got - want) <= tol * Math.max(1, Math.abs(want)), `${got} vs ${want}`);

const bar = { material: 'steel', section: 'bar' };
const triangle = {
  dimension: 2,
  materials: [{ id: 'steel', elastic_modulus: 2e8 }],
  sections: [{ id: 'bar', area: 1e-3 }],
  nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [4, 0] }, { id: 'C', at: [2, 2] }],
  members: [{ ...bar, id: 'AB', ends: ['A', 'B'] }, { ...bar, id: 'BC', ends: ['B', 'C'] }, { ...bar, id: 'AC', ends: ['A', 'C'] }],
  supports: [{ node: 'A', fix: ['x', 'y'] }, inclinedSupport('B', ['y'], [[Math.sqrt(3), 1]])],
  load_cases: [{ id: 'apex', loads: [{ node: 'C', force: [0, -12] }] }],
};

function pitched(topZ = 3) {
  const ids = 'ABCD';
  const points = [[0, 0, 0], [6, 0, 0], [6, 4, topZ], [0, 4, 3]];
  return {
    dimension: 3,
    materials: [{ id: 'steel', elastic_modulus: 2.1e8 }],
    sections: [{ id: 'hollow', area: 4e-3, second_moment: 2e-5 }],
    nodes: points.map((at, i) => ({ id: ids[i], at })),
    members: [0, 1, 2, 3].map((i) => ({ id: ids[i] + ids[(i + 1) % 4], ends: [ids[i], ids[(i + 1) % 4]], material: 'steel', section: 'hollow', type: 'beam' })),
    supports: [...ids].map((node) => ({ node, fix: ['x', 'y', 'z'] })),
    load_cases: [{ id: 'snow', area_loads: [areaLoad(['A', 'B', 'C', 'D'], { value: [0, 0, -0.8], projected: true })] }],
  };
}

test('a roller on a 30° incline reports its reaction in both axes', { skip }, async () => {
  const client = new Client({ binary: bin });
  try {
    const result = await client.solve(triangle);
    const local = localReactions(result).get('apex');
    assert.deepEqual([...local.keys()], ['B']);
    close(local.get('B')[1], 6 / Math.cos(Math.PI / 6), 1e-9);
    close(local.get('B')[0], 0, 1e-9);
    const b = result.cases[0].reactions[1].force;
    close(b[0], -6 * Math.tan(Math.PI / 6), 1e-9);
    close(b[1], 6, 1e-9);
  } finally {
    await client.close();
  }
});

test('projected snow on a pitched panel totals the load times the plan area', { skip }, async () => {
  const client = new Client({ binary: bin });
  try {
    const result = await client.solve(pitched());
    for (const r of result.cases[0].reactions) close(r.force[2], 19.2 / 4, 1e-9);
    await assert.rejects(client.solve(pitched(4)), (e) => e instanceof InvalidModel &&
      e.problems.some((p) => p.path.startsWith('/params/model/load_cases/0/area_loads/0/nodes/')));
  } finally {
    await client.close();
  }
});

test('the builders refuse what the model would', () => {
  assert.throws(() => areaLoad(['A', 'B', 'C'], {}), TypeError);
  assert.throws(() => areaLoad(['A', 'B', 'C'], { pressure: 1, value: [0, 0, -1] }), TypeError);
  assert.throws(() => inclinedSupport('B', ['y'], []), TypeError);
});
