// Design by forces: edit the force diagram of a sign gantry, get the form back.
//
// The scenario (our own invention): a steel gantry spans 9 m over Wendle
// Street in three 3 m panels, 2 m deep, pinned at the west footing (L0) and
// on a sliding bearing at the east one (L3). Two direction signs hang from
// its bottom chord: 14 kN at L1 and 8 kN at L2.
//
// 1. reciprocate draws Maxwell's reciprocal force diagram: every space of the
//    form (lettered outside, numbered inside, Bow's notation) becomes a point,
//    every member a segment as long as its force.
// 2. We drag the point of the first panel's face 3 kN to the left. That asks
//    the first bottom-chord bar (L0-L1) for 3 kN more tension. The drag runs
//    along the bottom chord's direction, so the chord stays straight and the
//    two footings can stay where they are.
// 3. reciprocate with edit redraws the form so that every member is parallel
//    to its edited segment; we print how far each node moved.
// 4. solve analyses the redrawn gantry by the stiffness method: its member
//    forces are the lengths we drew, and every node is in equilibrium (the
//    closure error is round-off).
//
// Run from clients/node:
//
//     node examples/gantry-by-forces.mjs [OUTPUT_FOLDER]
//
// The diagrams, the redrawn form and the forces go into gantry-round-trip.json
// in OUTPUT_FOLDER, else $GUSSET_EXAMPLES_OUT, else a new temporary folder.

import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

import { Client, GussetNotFound } from '../src/index.js';

const DRAG = -3; // kN, along x in the force diagram
const CAUTION = 'Preliminary design aid: a qualified engineer must check the design against the local codes and standards.';

const NODES = { L0: [0, 0], L1: [3, 0], L2: [6, 0], L3: [9, 0], U1: [3, 2], U2: [6, 2] };
const BARS = ['L0-L1', 'L1-L2', 'L2-L3', 'U1-U2', 'L0-U1', 'U2-L3', 'U1-L1', 'U2-L2', 'U1-L2'];
const MODEL = {
  dimension: 2,
  units: { length: 'm', force: 'kN' },
  materials: [{ id: 'steel', elastic_modulus: 2.1e8 }],
  sections: [{ id: 'box', area: 0.003 }],
  nodes: Object.entries(NODES).map(([id, at]) => ({ id, at })),
  members: BARS.map((id) => ({ id, ends: id.split('-'), material: 'steel', section: 'box' })),
  supports: [{ node: 'L0', fix: ['x', 'y'] }, { node: 'L3', fix: ['y'] }],
  load_cases: [{ id: 'signs', loads: [{ node: 'L1', force: [0, -14] }, { node: 'L2', force: [0, -8] }] }],
};

/**
 * closure returns, per node, |Σ forces| (kN): member forces, loads and
 * reactions. A member in tension (N > 0) pulls each of its ends towards the
 * other.
 */
function closure(model, result) {
  const at = Object.fromEntries(model.nodes.map((n) => [n.id, n.at]));
  const total = Object.fromEntries(model.nodes.map((n) => [n.id, [0, 0]]));
  model.members.forEach((member, k) => {
    const [a, b] = member.ends;
    const d = [at[b][0] - at[a][0], at[b][1] - at[a][1]];
    const length = Math.hypot(...d);
    const force = result.axial_forces[k];
    for (const [node, sign] of [[a, 1], [b, -1]]) {
      total[node][0] += sign * force * d[0] / length;
      total[node][1] += sign * force * d[1] / length;
    }
  });
  for (const { node, force } of [...model.load_cases[0].loads, ...result.reactions]) {
    total[node][0] += force[0];
    total[node][1] += force[1];
  }
  return model.nodes.map((n) => Math.hypot(...total[n.id]));
}

const f = (value, digits, width) => (Math.abs(value) < 0.5 * 10 ** -digits ? 0 : value).toFixed(digits).padStart(width);

async function main() {
  const folder = process.argv[2] || process.env.GUSSET_EXAMPLES_OUT || mkdtempSync(path.join(tmpdir(), 'gusset-gantry-'));
  mkdirSync(folder, { recursive: true });
  const client = new Client();
  let diagram, face, moved, form, redrawn, result;
  try {
    // 1. The force diagram of the gantry as drawn.
    diagram = await client.reciprocate(MODEL);
    console.log('Force diagram: member, its two spaces, force (kN, tension +)');
    for (const seg of diagram.members) {
      console.log(`  ${seg.member.padEnd(6)} ${seg.spaces.join('-').padEnd(5)} ${f(seg.force, 2, 8)}`);
    }

    // 2. The face inside the first panel is the numbered space that L0-L1
    // and L0-U1 share; move its point.
    const spacesOf = (id) => diagram.members.find((seg) => seg.member === id).spaces;
    face = spacesOf('L0-L1').find((label) => spacesOf('L0-U1').includes(label));
    const old = diagram.spaces.find((s) => s.label === face).point;
    moved = [old[0] + DRAG, old[1]];
    const xy = (p) => `(${p.map((v) => v.toFixed(2)).join(', ')})`;
    console.log(`Moving point ${face} from ${xy(old)} to ${xy(moved)}`);

    // 3. The form that fits the edited diagram.
    const edited = await client.reciprocate(MODEL, { edit: { points: { [face]: moved } } });
    form = edited.form;
    console.log(`Redrawn form (residual ${form.residual.toExponential(1)} m): node, old position, new position, moved (m)`);
    for (const node of form.nodes) {
      const was = NODES[node.id];
      const [x, y] = node.at;
      console.log(`  ${node.id.padEnd(3)} (${f(was[0], 2, 5)}, ${f(was[1], 2, 5)}) -> (${f(x, 3, 6)}, ${f(y, 3, 6)})  ${node.moved.toFixed(3)}`);
    }

    // 4. Solve the redrawn gantry: the forces found are those drawn.
    redrawn = structuredClone(MODEL);
    redrawn.nodes.forEach((node, k) => { node.at = form.nodes[k].at; });
    [result] = (await client.solve(redrawn)).cases;
  } finally {
    await client.close();
  }
  const points = Object.fromEntries(diagram.spaces.map((s) => [s.label, s.point]));
  points[face] = moved;
  console.log('Member forces of the redrawn gantry (kN): drawn |segment| and found by solve');
  BARS.forEach((member, k) => {
    const [a, b] = diagram.members.find((seg) => seg.member === member).spaces;
    const drawn = Math.hypot(points[b][0] - points[a][0], points[b][1] - points[a][1]);
    const force = result.axial_forces[k];
    console.log(`  ${member.padEnd(6)} ${f(drawn, 3, 8)} ${f(force, 3, 9)} ${force > 0 ? 'tension' : 'compression'}`);
  });
  const errors = closure(redrawn, result);
  console.log(`Closure error: largest |Σ forces| at a node ${Math.max(...errors).toExponential(1)} kN`);

  const file = path.join(folder, 'gantry-round-trip.json');
  const record = {
    model: MODEL, edited_face: face, edited_point: moved, diagram, form, redrawn_model: redrawn, solved: result, closure: errors,
  };
  writeFileSync(file, JSON.stringify(record, null, 1) + '\n');
  console.log('written:', file);
  console.log(CAUTION);
}

main().catch((err) => {
  console.error(err instanceof GussetNotFound ? err.message : err);
  process.exitCode = 1;
});
