// Tests of the member-result helpers against a simple span solved by the real
// binary. Expected values are the beam tables' (Young & Budynas, Roark's
// Formulas for Stress and Strain, 7th ed., 2002, Table 8.1 case 2e; from
// memory): a span L under w has M(x) = wx(L − x)/2, wL²/8 at mid-span, and
// deflects 5wL⁴/384EI.

import assert from 'node:assert/strict';
import { test } from 'node:test';

import { Client, memberCheck, memberResult, memberResults, momentDiagram } from '../src/index.js';
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

// memberCheck on the span (bending wL²/8 over W·f = 125/235, Roark) and on
// two 5 m bars A (0, 0) – B (4, 3) – C (8, 0) carrying their own weight
// W = 77·0.005·5 kN across them under 100 kN at B: by hand statics the foot
// of each carries N = −(100 + W)/(2 sin θ) − (W/2) sin θ (sin θ = 3/5),
// checked as |N|/(χ·A·fc) with χ from EN 1993-1-1 eq. (6.49), curve d
// (α = 0.76); they bend as simple spans, but the section gives no section
// modulus, so their bending is not checked and only the axial part is
// known.
test('member checks by id', { skip }, async () => {
  const truss = {
    dimension: 2,
    materials: [{ id: 'steel', elastic_modulus: E, tension_limit: 2.35e5, compression_limit: 2.35e5, weight_density: 77 }],
    sections: [{ id: 's', area: 0.005, second_moment: I }],
    nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [4, 3] }, { id: 'C', at: [8, 0] }],
    members: [{ id: 'AB', ends: ['A', 'B'], material: 'steel', section: 's' }, { id: 'BC', ends: ['B', 'C'], material: 'steel', section: 's' }],
    supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'C', fix: ['x', 'y'] }],
    load_cases: [{ id: 'dead', self_weight: true, loads: [{ node: 'B', force: [0, -100] }] }],
  };
  const client = new Client({ binary: bin });
  try {
    const span = (await client.call('solve', { model })).cases[0];
    const bars = (await client.call('solve', { model: truss })).cases[0];
    let check = memberCheck(span, model, 'span');
    assert.equal(check.checked, true);
    close(check.utilisation, (W * L * L) / 8 / (1e-3 * 2.35e5), 1e-12);
    assert.equal(check.axial_utilisation, 0);
    const [weight, sin] = [77 * 0.005 * 5, 0.6];
    const foot = (100 + weight) / (2 * sin) + (weight / 2) * sin;
    const [squash, critical] = [0.005 * 2.35e5, (Math.PI ** 2 * E * I) / 25];
    const slenderness = Math.sqrt(squash / critical);
    const phi = 0.5 * (1 + 0.76 * (slenderness - 0.2) + slenderness ** 2);
    const chi = 1 / (phi + Math.sqrt(phi * phi - slenderness ** 2));
    check = memberCheck(bars, truss, 'AB');
    assert.equal(check.checked, false);
    assert.equal(check.utilisation, null);
    close(check.axial_utilisation, foot / (chi * squash), 1e-12);
    assert.throws(() => memberCheck(bars, truss, 'missing'), RangeError);
  } finally {
    await client.close();
  }
});
