// End releases through the real binary.
//
// A Gerber beam: supports A (pin), B and C (rollers) at 0, 6 and 12 m with a
// hinge G at 7.5 m, 10 kN/m over the whole length. Statics by hand (R. C.
// Hibbeler, Structural Analysis, compound beams, from memory): the suspended
// part GC is simply supported, so R_C = 10 × 4.5 / 2 = 22.5 kN; moments about
// A of the overhanging part A–B–G give R_B = 75 kN, and R_A = 22.5 kN; the
// hogging moment at B is 10 × 1.5² / 2 + 22.5 × 1.5 = 45 kN·m, and the moment
// at the hinge is zero.

import assert from 'node:assert/strict';
import { test } from 'node:test';

import { Client, InvalidModel, memberResult, released } from '../src/index.js';
import { binary } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const close = (got, want, tol) => assert.ok(Math.abs(got - want) <= tol * Math.max(1, Math.abs(want)), `${got} vs ${want}`);

function gerber() {
  const beam = { material: 'steel', section: 'deck', type: 'beam' };
  return {
    dimension: 2,
    materials: [{ id: 'steel', elastic_modulus: 2.1e8 }],
    sections: [{ id: 'deck', area: 4e-3, second_moment: 8e-6 }],
    nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [6, 0] }, { id: 'G', at: [7.5, 0] }, { id: 'C', at: [12, 0] }],
    members: [
      { ...beam, id: 'AB', ends: ['A', 'B'] },
      released({ ...beam, id: 'BG', ends: ['B', 'G'] }, { second: ['rz'] }),
      { ...beam, id: 'GC', ends: ['G', 'C'] },
    ],
    supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['y'] }, { node: 'C', fix: ['y'] }],
    load_cases: [{ id: 'udl', member_loads: ['AB', 'BG', 'GC'].map((member) => ({ member, kind: 'uniform', value: [0, -10] })) }],
  };
}

test('released builds the releases object', () => {
  const beam = { id: 'b', type: 'beam' };
  assert.deepEqual(released(beam, { first: ['rz'] }).releases, { first: ['rz'] });
  assert.equal(released(beam).releases, undefined);
  assert.equal(beam.releases, undefined);
  assert.throws(() => released(beam, { second: ['z'] }), TypeError);
});

test('a Gerber beam solves to its statics', { skip }, async () => {
  const client = new Client({ binary: bin });
  try {
    const result = await client.solve(gerber(), { stations: 3 });
    const c = result.cases[0];
    const want = [22.5, 75, 22.5];
    c.reactions.forEach((r, i) => close(r.force[1], want[i], 1e-9));
    const bg = memberResult(c, 'BG');
    close(bg.moment_z[0], -45, 1e-9);
    close(bg.moment_z[bg.moment_z.length - 1], 0, 1e-9);
    const bad = gerber();
    bad.members[0] = released({ ...bad.members[0], type: 'bar' }, { first: ['rz'] });
    await assert.rejects(client.solve(bad), (err) => err instanceof InvalidModel && err.problems[0].path === '/params/model/members/0/releases');
  } finally {
    await client.close();
  }
});
