// Tests of the member-result helpers against a simple span solved by the real
// binary. Expected values are the beam tables' (Young & Budynas, Roark's
// Formulas for Stress and Strain, 7th ed., 2002, Table 8.1 case 2e; from
// memory): a span L under w has M(x) = wx(L − x)/2, wL²/8 at mid-span, and
// deflects 5wL⁴/384EI.

import assert from 'node:assert/strict';
import { test } from 'node:test';

import { Client, memberResult, memberResults, momentDiagram } from '../src/index.js';
import { binary } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const [L, W, E, I] = [10, 10, 2.1e8, 1e-4];

const model = {
  dimension: 2,
  materials: [{ id: 'steel', elastic_modulus: E, tension_limit: 2.35e5, compression_limit: 2.35e5 }],
  sections: [{ id: 'deck', area: 0.01, second_moment: I, section_modulus: 1e-3 }],
  nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [L, 0] }],
  members: [{ id: 'span', ends: ['A', 'B'], material: 'steel', section: 'deck', type: 'beam' }],
  supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['y'] }],
  load_cases: [{ id: 'udl', member_loads: [{ member: 'span', kind: 'uniform', value: [0, -W] }] }],
};

const close = (got, want, tol) => assert.ok(Math.abs(got - want) <= tol * Math.max(1, Math.abs(want)), `${got} vs ${want}`);

test('member results by id', { skip }, async () => {
  const client = new Client({ binary: bin });
  try {
    const result = await client.call('solve', { model, stations: 5 });
    const c = result.cases[0];
    const span = memberResult(c, 'span');
    close(span.peak_moment_z.value, (W * L * L) / 8, 1e-12);
    close(span.peak_deflection_y.value, (-5 * W * L ** 4) / (384 * E * I), 1e-12);
    const diagram = momentDiagram(c, 'span');
    assert.equal(diagram.length, 5);
    for (const [x, m] of diagram) close(m, (W * x * (L - x)) / 2, 1e-12);
    assert.deepEqual([...memberResults(result, 'span')].map(([id]) => id), ['udl']);
    assert.throws(() => memberResult(c, 'missing'), RangeError);
  } finally {
    await client.close();
  }
});
