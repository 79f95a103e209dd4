// Pattern loading and envelopes through the real binary.
//
// Two equal spans L = 5 m, a live load q = 8 kN/m on each span as its own
// case, all on/off patterns. Clapeyron's equation of three moments
// (Timoshenko & Young, Theory of Structures, 1965, §9.1; worked here): with
// both spans loaded 4·M_B = −2qL²/4, M_B = −qL²/8 = −25 kN·m (the support
// moment); with span 1 alone M_B = −qL²/16, and span 1's moment
// q·x(L − x)/2 + M_B·x/L is largest at x = L/2 + M_B/(qL) = 7L/16, where it
// is 49qL²/512 = 19.140625 kN·m (the beam tables' 0.0957 qL², from memory).
// The material has no limits, so the utilisation is unchecked.

import assert from 'node:assert/strict';
import { test } from 'node:test';

import { Client, GussetError, governing, memberEnvelope, onOffPattern } from '../src/index.js';
import { binary } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const close = (got, want, tol) => assert.ok(Math.abs(got - want) <= tol * Math.max(1, Math.abs(want)), `${got} vs ${want}`);

const L = 5;
const q = 8;
const beam = { material: 'steel', section: 'deck', type: 'beam' };
const twoSpans = {
  dimension: 2,
  materials: [{ id: 'steel', elastic_modulus: 2.1e8 }],
  sections: [{ id: 'deck', area: 5e-3, second_moment: 8e-5 }],
  nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [L, 0] }, { id: 'C', at: [2 * L, 0] }],
  members: [{ ...beam, id: 'AB', ends: ['A', 'B'] }, { ...beam, id: 'BC', ends: ['B', 'C'] }],
  supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['y'] }, { node: 'C', fix: ['y'] }],
  load_cases: [
    { id: 'Q1', member_loads: [{ member: 'AB', kind: 'uniform', value: [0, -q] }] },
    { id: 'Q2', member_loads: [{ member: 'BC', kind: 'uniform', value: [0, -q] }] },
  ],
  patterns: [onOffPattern('live', ['Q1', 'Q2'])],
};

test('envelope of the on/off patterns of two spans', { skip }, async () => {
  const client = new Client({ binary: bin });
  try {
    const x = await client.call('solve', { model: twoSpans, envelope: { cases: ['live'], omit_cases: true } });
    assert.deepEqual(x.cases, []);
    assert.deepEqual(x.envelope.cases, ['live/all-off', 'live/on:Q1', 'live/on:Q2', 'live/on:Q1+Q2']);
    const span = governing(x, 'AB', 'moment_z', 'max');
    close(span.value, 19.140625, 1e-9);
    assert.equal(span.case, 'live/on:Q1');
    close(span.at, 35 / 16, 1e-9);
    const support = governing(x, 'AB', 'moment_z', 'min');
    close(support.value, -25, 1e-9);
    assert.equal(support.case, 'live/on:Q1+Q2');
    close(support.at, 5, 1e-12);
    assert.equal(memberEnvelope(x, 'AB').utilisation, null);
    assert.throws(() => governing(x, 'AB', 'utilisation'), /not checked/);

    await assert.rejects(client.call('solve', { model: twoSpans, envelope: { cases: ['snow'] } }), (err) => {
      assert.ok(err instanceof GussetError);
      assert.equal(err.problems[0].path, '/params/envelope/cases/0');
      return true;
    });
  } finally {
    await client.close();
  }
});
