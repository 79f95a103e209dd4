// Tests that run every worked example in clients/node/examples against the
// real binary. Each example runs as a user runs it (`node examples/x.mjs` from
// clients/node, in a fresh process) and its files are checked against results
// derived by hand, not against the solver's own output.

import assert from 'node:assert/strict';
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, realpathSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { after, before, describe, test } from 'node:test';

import { binary } from '../testing/fixtures.js';

const run = promisify(execFile);
const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const CLIENT = fileURLToPath(new URL('..', import.meta.url));
const CAUTION = 'Preliminary design aid: a qualified engineer must check the design against the local codes and standards.';
const STANDARD_GRAVITY = 9.80665; // m/s², 3rd CGPM (1901)

/**
 * runExample runs one example from clients/node and resolves with its standard output.
 * @param {string} name
 * @param {string[]} args
 * @param {Record<string, string>} [env]
 */
async function runExample(name, args, env = {}) {
  const environ = { ...process.env, GUSSET_BINARY: bin, ...env };
  if (!('GUSSET_EXAMPLES_OUT' in env)) delete environ.GUSSET_EXAMPLES_OUT;
  const options = { cwd: CLIENT, env: environ, timeout: 60_000 };
  const { stdout } = await run(process.execPath, [path.join('examples', name), ...args], options);
  return stdout;
}

/** close is |value − expected| ≤ max(rel·|expected|, abs). */
const close = (value, expected, rel, abs = 0) => Math.abs(value - expected) <= Math.max(rel * Math.abs(expected), abs);

/** readCsv parses a CSV file without quoted fields into its header and row objects. */
function readCsv(file) {
  const [head, ...lines] = readFileSync(file, 'utf8').trimEnd().split('\n');
  const header = head.split(',');
  return { header, rows: lines.map((line) => Object.fromEntries(line.split(',').map((v, i) => [header[i], v]))) };
}

/**
 * parseXml checks that text is well-formed XML (W3C, Extensible Markup
 * Language 1.0, fifth edition, 2008: one root, matched and nested tags,
 * quoted attributes, no bare '<' or '&' in text) and returns the element
 * tree as {tag, attrs, children, text}. Node has no XML parser of its own;
 * this covers what an SVG written by hand uses (no DTD, no CDATA).
 */
function parseXml(text) {
  const token = /<!--[\s\S]*?-->|<\?[\s\S]*?\?>|<\/([A-Za-z_][\w.:-]*)\s*>|<([A-Za-z_][\w.:-]*)((?:\s+[A-Za-z_][\w.:-]*\s*=\s*(?:"[^"<]*"|'[^'<]*'))*)\s*(\/?)>|([^<]+)|(<)/g;
  const entity = /&(?!(?:amp|lt|gt|quot|apos|#\d+|#x[0-9a-fA-F]+);)/;
  const root = { tag: '', attrs: {}, children: [], text: '' };
  const stack = [root];
  let match;
  while ((match = token.exec(text)) !== null) {
    const [, close, open, attrs, selfClosing, chars, stray] = match;
    const top = stack.at(-1);
    if (stray) throw new Error(`stray '<' at offset ${match.index}`);
    if (chars !== undefined) {
      if (entity.test(chars)) throw new Error(`bare '&' at offset ${match.index}`);
      if (stack.length === 1 && chars.trim()) throw new Error(`text outside the root at offset ${match.index}`);
      top.text += chars;
    } else if (close) {
      if (top.tag !== close) throw new Error(`</${close}> closes <${top.tag || '(nothing)'}> at offset ${match.index}`);
      stack.pop();
    } else if (open) {
      const element = { tag: open, attrs: {}, children: [], text: '' };
      for (const [, name, v1, v2] of attrs.matchAll(/([A-Za-z_][\w.:-]*)\s*=\s*(?:"([^"]*)"|'([^']*)')/g)) {
        if (name in element.attrs) throw new Error(`attribute ${name} twice in <${open}>`);
        if (entity.test(v1 ?? v2)) throw new Error(`bare '&' in attribute ${name}`);
        element.attrs[name] = v1 ?? v2;
      }
      if (stack.length === 1 && root.children.length > 0) throw new Error('more than one root element');
      top.children.push(element);
      if (!selfClosing) stack.push(element);
    }
  }
  if (stack.length !== 1) throw new Error(`<${stack.at(-1).tag}> is never closed`);
  if (root.children.length !== 1) throw new Error('no root element');
  return root.children[0];
}

/**
 * prattMemberForces returns [axial force, length] of every member of the
 * walkway's Pratt truss, derived by the method of sections (Ritter's method;
 * Hibbeler, Structural Analysis, ch. 3, from memory) for n panels of width a
 * and depth h (n even), end posts leaning in, inner diagonals sloping down to
 * mid-span, a load P at each inner bottom node, pin and roller at the ends.
 * Reactions R = (n − 1)P/2; the moment at bottom node i is M_i = P·a·i·(n − i)/2
 * and the shear in panel i is V_i = R − i·P; the diagonal's length is
 * d = √(a² + h²). In the left half (right half by symmetry), panel i:
 *   bottom chord  +M_i/h (moments about U_i), +M_1/h in the end panel;
 *   top chord     −M_(i+1)/h (moments about L_(i+1)), panels 1..;
 *   end post      −R·d/h (vertical equilibrium of L0);
 *   diagonal      +V_i·d/h (vertical forces on the section);
 *   vertical U1   +P (L1 holds only the chords, U1-L1 and the load);
 *   vertical U_i  −V_i for 2 ≤ i < n/2 (vertical forces at U_i).
 * The middle vertical carries nothing for n ≥ 4 and +P for n = 2, where the
 * truss is two struts, a tie and a hanger: Z = P·h + P(a² + h²)/h + P·a²/h.
 */
function prattMemberForces(n, a, h, p) {
  const r = (n - 1) * p / 2;
  const d = Math.hypot(a, h);
  const moment = (i) => p * a * i * (n - i) / 2;
  const half = [];
  for (let i = 0; i < n / 2; i++) {
    half.push([moment(Math.max(i, 1)) / h, a]);
    if (i >= 1) {
      half.push([-moment(i + 1) / h, a]);
      half.push([i === 1 ? p : -(r - i * p), h]);
    }
    half.push([(i === 0 ? -r : r - i * p) * d / h, d]);
  }
  return [...half, ...half, [n === 2 ? p : 0, h]];
}

describe('walkway-variants.mjs', { skip }, () => {
  const SPAN = 18;
  const LINE_LOAD = 6;
  const PANELS = [2, 4, 6, 8];
  const DEPTHS = Array.from({ length: 16 }, (_, i) => 0.75 + 0.25 * i);
  const [LIMIT, WEIGHT_DENSITY, CARBON_FACTOR] = [2.35e5, 77, 1.55]; // kN/m², kN/m³, kg CO2e/kg
  let folder;
  let stdout;
  let table;

  before(async () => {
    folder = mkdtempSync(path.join(tmpdir(), 'gusset-example-test-'));
    stdout = await runExample('walkway-variants.mjs', [], { GUSSET_EXAMPLES_OUT: folder });
    table = readCsv(path.join(folder, 'walkway-variants.csv'));
  });
  after(() => { if (folder) rmSync(folder, { recursive: true, force: true }); });

  test('the table has a row per variant', () => {
    assert.deepEqual(table.header,
      ['variant', 'depth_m', 'panels', 'max_force_kN', 'load_path_kNm', 'volume_m3', 'mass_kg', 'carbon_kgCO2e']);
    assert.deepEqual(readdirSync(folder).sort(), ['walkway-variants.csv', 'walkway-volume.svg']);
    const got = table.rows.map((r) => `${Number(r.panels)}@${Number(r.depth_m)}`).sort();
    assert.deepEqual(got, PANELS.flatMap((n) => DEPTHS.map((h) => `${n}@${h}`)).sort());
    assert.equal(new Set(table.rows.map((r) => r.variant)).size, table.rows.length);
    assert.ok(stdout.includes(CAUTION));
  });

  test('load path and largest force by the method of sections', () => {
    for (const row of table.rows) {
      const n = Number(row.panels);
      const h = Number(row.depth_m);
      const a = SPAN / n;
      const forces = prattMemberForces(n, a, h, LINE_LOAD * a);
      assert.equal(forces.length, 4 * n - 3); // Maxwell's rule: b = 2j − 3 with j = 2n
      const z = forces.reduce((s, [f, l]) => s + Math.abs(f) * l, 0);
      const biggest = Math.max(...forces.map(([f]) => Math.abs(f)));
      assert.ok(close(Number(row.load_path_kNm), z, 1e-9), `${row.variant}: ${row.load_path_kNm} vs ${z}`);
      assert.ok(close(Number(row.max_force_kN), biggest, 1e-9), `${row.variant}: ${row.max_force_kN} vs ${biggest}`);
    }
  });

  test('the two-panel load path in closed form', () => {
    // Two struts, a tie and a hanger under P = 54 kN at mid-span (a = 9 m):
    // Z = P·h + P(a² + h²)/h + P·a²/h by joint equilibrium (hand calculation,
    // common practice); at h = 1 m, 54 + 54·82 + 54·81 = 8856 kN·m.
    const row = table.rows.find((r) => r.panels === '2' && Number(r.depth_m) === 1);
    assert.ok(close(Number(row.load_path_kNm), 8856, 1e-9), row.load_path_kNm);
  });

  test('volume, mass and carbon', () => {
    // Each member needs at least |N|/σ of area, so V ≥ Σ|N|·L/σ = Z/σ with
    // equal limits (Maxwell 1870; Michell 1904). Mass is V × weight density /
    // g (kN → N: × 1000); carbon is mass × factor (common practice).
    for (const row of table.rows) {
      const [z, volume, mass] = [Number(row.load_path_kNm), Number(row.volume_m3), Number(row.mass_kg)];
      assert.ok(volume >= z / LIMIT * (1 - 1e-12), row.variant);
      assert.ok(close(mass, volume * WEIGHT_DENSITY * 1000 / STANDARD_GRAVITY, 1e-9), row.variant);
      assert.ok(close(Number(row.carbon_kgCO2e), mass * CARBON_FACTOR, 1e-9), row.variant);
    }
  });

  test('the chart is well-formed SVG that draws the table', () => {
    // One line per panel count whose points are an affine image of the
    // table's (depth, volume) pairs, the caution, axis titles with units.
    const svg = parseXml(readFileSync(path.join(folder, 'walkway-volume.svg'), 'utf8'));
    assert.equal(svg.tag, 'svg');
    assert.equal(svg.attrs.xmlns, 'http://www.w3.org/2000/svg');
    const texts = svg.children.filter((c) => c.tag === 'text').map((c) => c.text);
    assert.ok(texts.includes(CAUTION));
    assert.ok(texts.includes('depth (m)'));
    assert.ok(texts.includes('steel volume (m³)'));
    assert.ok(texts.filter((t) => /^\d+(\.\d+)?$/.test(t)).length >= 8, 'tick labels on both axes');
    const legend = {};
    svg.children.forEach((c, i) => {
      const label = svg.children[i + 1];
      if (c.tag === 'line' && c.attrs['stroke-width'] === '2' && label?.tag === 'text') legend[c.attrs.stroke] = label.text;
    });
    const lines = svg.children.filter((c) => c.tag === 'polyline');
    assert.deepEqual(lines.map((p) => legend[p.attrs.stroke]).sort(), PANELS.map((n) => `${n} panels`).sort());
    for (const polyline of lines) {
      const panels = Number(legend[polyline.attrs.stroke].split(' ')[0]);
      const data = table.rows.filter((r) => Number(r.panels) === panels)
        .map((r) => [Number(r.depth_m), Number(r.volume_m3)]).sort((p, q) => p[0] - q[0]);
      const points = polyline.attrs.points.split(' ').map((p) => p.split(',').map(Number));
      assert.equal(points.length, data.length);
      const [[d0, v0], [d1, v1]] = [data[0], data.at(-1)];
      const [[x0, y0], [x1, y1]] = [points[0], points.at(-1)];
      data.forEach(([d, v], k) => {
        const [x, y] = points[k];
        assert.ok(Math.abs(x - (x0 + (d - d0) / (d1 - d0) * (x1 - x0))) <= 0.2, `${panels} panels, depth ${d}: x`);
        assert.ok(Math.abs(y - (y0 + (v - v0) / (v1 - v0) * (y1 - y0))) <= 0.2, `${panels} panels, depth ${d}: y`);
      });
      assert.equal(y0 < y1, v0 > v1, 'larger volumes are drawn higher up');
    }
  });

  test('the XML check rejects what is not well-formed', () => {
    // Negative cases beside the positive one, so the check above means something.
    assert.throws(() => parseXml('<svg><text>a</svg>'), /closes/);
    assert.throws(() => parseXml('<svg><text>a & b</text></svg>'), /bare '&'/);
    assert.throws(() => parseXml('<svg x=1></svg>'), /stray/);
    assert.throws(() => parseXml('<svg/><svg/>'), /more than one root/);
    assert.equal(parseXml('<svg a="1"><g>x &amp; y</g></svg>').children[0].text, 'x &amp; y');
  });
});

describe('bell-hanger-sweep.mjs', { skip }, () => {
  const [A, P, LIMIT] = [1.2, 6, 2.35e5]; // half the anchor spacing (m), the bell (kN), design stress (kN/m²)
  // Each rod of length L = √(a² + h²) pulls N = P·L/(2h) by the vertical
  // equilibrium of the yoke (common practice), so Z = 2·N·L = P(a² + h²)/h.
  const loadPath = (h) => P * (A * A + h * h) / h;
  let folder;
  let stdout;
  let steps;
  let optimum;

  before(async () => {
    folder = mkdtempSync(path.join(tmpdir(), 'gusset-example-test-'));
    stdout = await runExample('bell-hanger-sweep.mjs', [folder]);
    steps = readCsv(path.join(folder, 'bell-sweep.csv')).rows;
    optimum = JSON.parse(readFileSync(path.join(folder, 'bell-optimum.json'), 'utf8'));
  });
  after(() => { if (folder) rmSync(folder, { recursive: true, force: true }); });

  test('every step is printed with its bar as it streams, then the optimum', () => {
    const lines = stdout.split('\n');
    const stepLines = lines.filter((line) => line.trimEnd().endsWith('#'));
    assert.equal(stepLines.length, 12);
    assert.deepEqual(stepLines.map((line) => Number(line.trim().split(/\s+/)[0])).sort((p, q) => p - q), [...Array(12).keys()]);
    for (const line of stepLines) {
      const [, depth, z, bar] = line.trim().split(/\s+/);
      assert.ok(close(Number(z), loadPath(Number(depth)), 1e-3, 0.006), line);
      assert.equal(bar.length, Math.round(Number(z))); // one mark per kN·m
    }
    const last = Math.max(...stepLines.map((line) => lines.indexOf(line)));
    assert.ok(lines[last + 1].startsWith('Least load path'), 'the optimum follows the steps');
    assert.ok(stdout.includes(CAUTION));
  });

  test('the steps follow the two-bar load path', () => {
    assert.equal(steps.length, 12);
    for (const row of steps) {
      const h = Number(row.depth_m);
      const z = Number(row.load_path_kNm);
      assert.ok(close(z, loadPath(h), 1e-9), `depth ${h}: ${z} vs ${loadPath(h)}`);
      // Rods only pull, so each is sized at N/σ exactly: V = Z/σ.
      assert.ok(close(Number(row.volume_m3), z / LIMIT, 1e-9), `depth ${h}`);
    }
  });

  test("the optimum is Michell's 45 degrees", () => {
    // dZ/dh = P(1 − a²/h²) vanishes at h = a: rods at 45°, Z = 2Pa (Michell
    // 1904, "The limits of economy of material in frame-structures", Phil.
    // Mag. 8, p. 589). The grid (steps of 0.25 m) misses h = a, so the
    // refinement found it. A flat minimum pins the parameter only to about √ε
    // relative (Press et al., Numerical Recipes, §10.1, from memory).
    assert.ok(!steps.some((r) => Math.abs(Number(r.depth_m) - A) < 0.01));
    const gridBest = steps.reduce((b, r) => (loadPath(Number(r.depth_m)) < loadPath(Number(b.depth_m)) ? r : b));
    assert.equal(optimum.start_index, Number(gridBest.index));
    assert.equal(optimum.converged, true);
    assert.equal(optimum.at_edge, false);
    assert.ok(close(optimum.values[0], A, 1e-6), String(optimum.values));
    assert.ok(close(optimum.metrics.load_path, 2 * P * A, 1e-12), String(optimum.metrics.load_path));
    assert.ok(close(optimum.metrics.volume, 2 * P * A / LIMIT, 1e-12), String(optimum.metrics.volume));
  });
});

describe('gantry-by-forces.mjs', { skip }, () => {
  let stdout;
  let file;
  let record;

  before(async () => {
    // No folder given: the example makes a temporary one and says where.
    stdout = await runExample('gantry-by-forces.mjs', []);
    file = stdout.split('\n').find((line) => line.startsWith('written:')).slice('written:'.length).trim();
    record = JSON.parse(readFileSync(file, 'utf8'));
  });
  after(() => { if (file) rmSync(path.dirname(file), { recursive: true, force: true }); });

  /** editedSegments returns each member's force-diagram vector after the edit. */
  const editedSegments = () => {
    const points = Object.fromEntries(record.diagram.spaces.map((s) => [s.label, s.point]));
    points[record.edited_face] = record.edited_point;
    return record.diagram.members.map(({ spaces: [a, b] }) => [points[b][0] - points[a][0], points[b][1] - points[a][1]]);
  };

  test('writes into a temporary folder', () => {
    assert.equal(realpathSync(path.dirname(path.dirname(file))), realpathSync(tmpdir()));
    assert.ok(stdout.includes(CAUTION));
  });

  test('the original diagram by hand', () => {
    // Reactions by moments about the bearings: R_L0 = (14·6 + 8·3)/9 = 12 kN;
    // the first bottom-chord bar by moments about U1: 12·3/2 = 18 kN tension
    // (method of sections, common practice).
    const [first] = record.diagram.members;
    assert.equal(first.member, 'L0-L1');
    assert.ok(close(first.force, 18, 1e-9), String(first.force));
    const old = record.diagram.spaces.find((s) => s.label === record.edited_face).point;
    assert.deepEqual(record.edited_point, [old[0] - 3, old[1]]);
  });

  test('the redrawn members are parallel to the edited segments', () => {
    // Corresponding lines of reciprocal figures are parallel (Maxwell 1864,
    // "On reciprocal figures and diagrams of forces", Phil. Mag. 27): the
    // cross product of each member with its segment vanishes.
    const original = Object.fromEntries(record.model.nodes.map((n) => [n.id, n.at]));
    const at = Object.fromEntries(record.form.nodes.map((n) => [n.id, n.at]));
    const segments = editedSegments();
    record.model.members.forEach(({ id, ends: [a, b] }, k) => {
      const [mx, my] = [at[b][0] - at[a][0], at[b][1] - at[a][1]];
      const [sx, sy] = segments[k];
      const was = Math.hypot(original[b][0] - original[a][0], original[b][1] - original[a][1]);
      assert.ok(Math.hypot(mx, my) > 0.5 * was, `${id}: the form did not collapse`);
      assert.ok(Math.abs(mx * sy - my * sx) <= 1e-9 * Math.hypot(mx, my) * Math.hypot(sx, sy), id);
    });
    for (const id of ['L0', 'L3']) { // the bearings stay put
      assert.deepEqual(at[id].map((v) => Math.round(v * 1e12) / 1e12 + 0), original[id]);
    }
    assert.ok(Math.max(...record.form.nodes.map((n) => n.moved)) > 0.05);
  });

  test('the solved forces are the drawn lengths', () => {
    // In a reciprocal figure each line's length is the force in its member
    // (Maxwell 1864; Cremona, "Le figure reciproche nella statica grafica",
    // 1872, from memory): the dragged bar L0-L1 now carries 21 kN.
    const forces = record.solved.axial_forces;
    editedSegments().forEach(([sx, sy], k) => {
      assert.ok(close(Math.abs(forces[k]), Math.hypot(sx, sy), 1e-9), `${record.model.members[k].id}: ${forces[k]}`);
    });
    assert.ok(close(forces[0], 21, 1e-9), String(forces[0]));
  });

  test('the redrawn form is in equilibrium', () => {
    // ΣF = 0 at every pin (Newton's first law): members (tension pulls each
    // end towards the other), loads and reactions, summed here from the
    // solved forces on the redrawn geometry. Round-off only.
    const model = record.redrawn_model;
    const at = Object.fromEntries(model.nodes.map((n) => [n.id, n.at]));
    const total = Object.fromEntries(model.nodes.map((n) => [n.id, [0, 0]]));
    model.members.forEach(({ ends: [a, b] }, k) => {
      const [dx, dy] = [at[b][0] - at[a][0], at[b][1] - at[a][1]];
      const length = Math.hypot(dx, dy);
      const force = record.solved.axial_forces[k];
      total[a][0] += force * dx / length;
      total[a][1] += force * dy / length;
      total[b][0] -= force * dx / length;
      total[b][1] -= force * dy / length;
    });
    for (const { node, force } of [...model.load_cases[0].loads, ...record.solved.reactions]) {
      total[node][0] += force[0];
      total[node][1] += force[1];
    }
    const scale = 22; // kN, the two signs
    for (const [node, [fx, fy]] of Object.entries(total)) assert.ok(Math.hypot(fx, fy) <= 1e-10 * scale, node);
    assert.ok(Math.max(...record.closure) <= 1e-9 * scale);
  });
});

describe('examples', { skip }, () => {
  test('every example is tested', () => {
    const names = readdirSync(path.join(CLIENT, 'examples')).filter((n) => n.endsWith('.mjs')).sort();
    assert.deepEqual(names, ['bell-hanger-sweep.mjs', 'gantry-by-forces.mjs', 'walkway-variants.mjs']);
  });

  test('a missing binary says how to build it', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'gusset-example-test-'));
    try {
      await assert.rejects(
        runExample('gantry-by-forces.mjs', [folder], { GUSSET_BINARY: path.join(folder, 'no-such-gusset') }),
        (err) => err.code !== 0 && err.stderr.includes('go build -o gusset ./cmd/gusset') && !err.stderr.includes('    at '),
      );
      assert.deepEqual(readdirSync(folder), []);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });
});
