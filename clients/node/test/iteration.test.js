// One-sided members, cables and second order through the real binary.
//
// The X-braced panel (4 m wide, 3 m high, diagonals 5 m, cos θ = 0.8, A and B
// pinned, H = 12 kN at D): the sway shortens BD, which goes slack, and joint
// equilibrium by hand gives N_AC = H / cos θ = 15 kN and N_DC = −H = −12 kN
// (derived in engine/stiffness/activeset_test.go). The taut string (cables of
// 3 m and 5 m, pretension T = 400 kN, 2 kN across at the joint): to first
// order in the deflection the tension stays T, so T·δ/a + T·δ/b = P gives
// δ = P·a·b/(T·L) (small-deflection taut string, derived here; H. M. Irvine,
// Cable Structures, 1981, ch. 1, from memory), and the second solve repeats
// the first: amplification 1.

import assert from 'node:assert/strict';
import { test } from 'node:test';

import { Client, UnstableStructure, amplification, slackMembers } from '../src/index.js';
import { binary } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const close = (got, want, tol) => assert.ok(Math.abs(got - want) <= tol * Math.max(1, Math.abs(want)), `${got} vs ${want}`);

const rod = { material: 'steel', section: 'rod' };
const braced = {
  dimension: 2,
  materials: [{ id: 'steel', elastic_modulus: 2e8 }],
  sections: [{ id: 'rod', area: 1e-3 }],
  nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [4, 0] }, { id: 'C', at: [4, 3] }, { id: 'D', at: [0, 3] }],
  members: [
    { ...rod, id: 'AD', ends: ['A', 'D'] }, { ...rod, id: 'BC', ends: ['B', 'C'] },
    { ...rod, id: 'DC', ends: ['D', 'C'] }, { ...rod, id: 'AC', ends: ['A', 'C'], type: 'cable' },
    { ...rod, id: 'BD', ends: ['B', 'D'], behaviour: 'tension-only' },
  ],
  supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['x', 'y'] }],
  load_cases: [{ id: 'wind', loads: [{ node: 'D', force: [12, 0] }] }],
};

const [a, b, T, P] = [3, 5, 400, 2];
const cable = { material: 'wire', section: 'strand', type: 'cable', pretension: T };
const string = {
  dimension: 2,
  materials: [{ id: 'wire', elastic_modulus: 1e6 }],
  sections: [{ id: 'strand', area: 1 }],
  nodes: [{ id: 'A', at: [0, 0] }, { id: 'C', at: [a, 0] }, { id: 'B', at: [a + b, 0] }],
  members: [{ ...cable, id: 'AC', ends: ['A', 'C'] }, { ...cable, id: 'CB', ends: ['C', 'B'] }],
  supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['x', 'y'] }],
  load_cases: [{ id: 'point', loads: [{ node: 'C', force: [0, -P] }] }],
};

test('slack diagonal and taut string', { skip }, async () => {
  const client = new Client({ binary: bin });
  try {
    const x = await client.call('solve', { model: braced });
    const f = x.cases[0].axial_forces;
    close(f[3], 15, 1e-9);
    close(f[2], -12, 1e-9);
    assert.equal(f[4], 0);
    assert.deepEqual([...slackMembers(x)], [['wind', ['BD']]]);

    const s = await client.call('solve', { model: string, second_order: {} });
    close(s.cases[0].displacements[1][1], (-P * a * b) / (T * (a + b)), 1e-12);
    close(amplification(s).get('point'), 1, 1e-9);
    await assert.rejects(client.call('solve', { model: string }), UnstableStructure);
  } finally {
    await client.close();
  }
});
