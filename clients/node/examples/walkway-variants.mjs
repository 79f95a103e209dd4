// A generative workflow: many truss variants for the Ottery Pier walkway.
//
// The scenario (our own invention): at Kestle Bay, a timber walkway runs out
// along Ottery Pier on a pair of steel trusses, each spanning 18 m between
// pier heads and carrying 6 kN per metre run (crowd and deck) on its bottom
// chord. Which truss uses the least steel? We build Pratt trusses with 2, 4, 6
// and 8 panels and depths from 0.75 m to 4.5 m, send every variant to Gusset
// at once, and write a table (CSV) and a chart (SVG) of the steel needed.
//
// Run from clients/node:
//
//     node examples/walkway-variants.mjs [OUTPUT_FOLDER]
//
// The files go into OUTPUT_FOLDER, else $GUSSET_EXAMPLES_OUT, else a new
// temporary folder. The binary is found as the Client finds it
// ($GUSSET_BINARY, gusset on PATH, or the root of the repository).

import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

import { Client, GussetNotFound } from '../src/index.js';

const SPAN = 18; // m, between pier heads
const LINE_LOAD = 6; // kN per metre run, on the bottom chord
const PANELS = [2, 4, 6, 8];
const DEPTHS = Array.from({ length: 16 }, (_, i) => 0.75 + 0.25 * i); // m: 0.75, 1.0, ..., 4.5
const CAUTION = 'Preliminary design aid: a qualified engineer must check the design against the local codes and standards.';

// Structural steel: E 210 GPa, design stress 235 MPa both ways, 77 kN/m³,
// 1.55 kg CO2e per kg (stresses in kN/m², since the model is in m and kN).
const STEEL = {
  id: 'steel', elastic_modulus: 2.1e8, tension_limit: 2.35e5, compression_limit: 2.35e5,
  weight_density: 77, carbon_factor: 1.55,
};
// Members are sized as round tubes with diameter 30 times the wall, so that
// long struts get more steel against buckling.
const SIZING = { shape: 'tube', diameter_to_thickness: 30 };

/**
 * prattTruss builds one variant: bottom nodes L0..Ln, top nodes U1..Un-1.
 * The end posts lean in (L0-U1 and Un-1-Ln); the diagonals of the inner
 * panels slope down towards mid-span, so under gravity they pull and the
 * verticals push. A panel load sits on each inner bottom node; the half
 * panels at the ends go straight into the bearings and load no member.
 * @param {number} panels an even number of panels
 * @param {number} depth m
 */
function prattTruss(panels, depth) {
  const a = SPAN / panels;
  const nodes = [];
  const pairs = [];
  const loads = [];
  for (let i = 0; i <= panels; i++) nodes.push({ id: `L${i}`, at: [i * a, 0] });
  for (let i = 1; i < panels; i++) nodes.push({ id: `U${i}`, at: [i * a, depth] });
  for (let i = 0; i < panels; i++) pairs.push([`L${i}`, `L${i + 1}`]); // bottom chord
  for (let i = 1; i < panels - 1; i++) pairs.push([`U${i}`, `U${i + 1}`]); // top chord
  for (let i = 1; i < panels; i++) pairs.push([`U${i}`, `L${i}`]); // verticals
  for (let i = 0; i < panels; i++) { // one diagonal per panel, leaning towards mid-span
    if (i < panels / 2) pairs.push(i === 0 ? ['L0', 'U1'] : [`U${i}`, `L${i + 1}`]);
    else pairs.push(i === panels - 1 ? [`U${i}`, `L${i + 1}`] : [`L${i}`, `U${i + 1}`]);
  }
  for (let i = 1; i < panels; i++) loads.push({ node: `L${i}`, force: [0, -LINE_LOAD * a] });
  return {
    dimension: 2,
    units: { length: 'm', force: 'kN' },
    materials: [STEEL],
    sections: [{ id: 'tube', area: 0.002, second_moment: 3e-6 }], // a start: load-path sizes each member
    nodes,
    members: pairs.map(([p, q]) => ({ id: `${p}-${q}`, ends: [p, q], material: 'steel', section: 'tube' })),
    supports: [{ node: 'L0', fix: ['x', 'y'] }, { node: `L${panels}`, fix: ['y'] }],
    load_cases: [{ id: 'crowd', loads }],
  };
}

/**
 * evaluate sends one variant to load-path and keeps what the table needs.
 * @param {Client} client
 * @param {number} panels
 * @param {number} depth
 */
async function evaluate(client, panels, depth) {
  const result = await client.loadPath(prattTruss(panels, depth), { sizing: SIZING });
  const total = result.totals.all;
  return {
    variant: `pratt-${panels}-${depth.toFixed(2)}`,
    depth_m: depth,
    panels,
    max_force_kN: Math.max(...result.members.force.map(Math.abs)),
    load_path_kNm: total.load_path,
    volume_m3: total.volume,
    mass_kg: total.mass,
    carbon_kgCO2e: total.carbon,
  };
}

/** niceTicks returns round tick values (1, 2 or 5 times a power of ten) covering [low, high]. */
function niceTicks(low, high, count = 6) {
  const raw = (high - low) / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw);
  // The 1e-9 keeps a bound that is already a tick from gaining one more.
  const first = Math.floor(low / step + 1e-9);
  const last = Math.ceil(high / step - 1e-9);
  return Array.from({ length: last - first + 1 }, (_, i) => (first + i) * step);
}

/** fmt prints a tick value without floating-point noise (0.06, not 0.060000000000000005). */
const fmt = (v) => String(Number(v.toFixed(6)));

/** chart draws volume against depth, one line per panel count, as SVG text. */
function chart(rows) {
  const [width, height, left, right, top, bottom] = [760, 500, 80, 170, 70, 90];
  const xs = niceTicks(0, Math.max(...rows.map((r) => r.depth_m)));
  const ys = niceTicks(0, Math.max(...rows.map((r) => r.volume_m3)));
  const px = (x) => (left + (x - xs[0]) / (xs.at(-1) - xs[0]) * (width - left - right)).toFixed(1);
  const py = (y) => (height - bottom - (y - ys[0]) / (ys.at(-1) - ys[0]) * (height - top - bottom)).toFixed(1);
  const out = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" font-family="DejaVu Sans, Liberation Sans, Arial, sans-serif" font-size="12">`,
    '<rect width="100%" height="100%" fill="white"/>',
    `<text x="${left}" y="28" font-size="16">Ottery Pier walkway: steel volume of Pratt trusses, 18 m span</text>`,
    `<text x="${left}" y="48">6 kN/m on the bottom chord; members sized as steel tubes` +
      ' (D/t = 30, 235 MPa), buckling included</text>',
  ];
  for (const x of xs) { // vertical grid lines with their labels
    out.push(`<line x1="${px(x)}" y1="${top}" x2="${px(x)}" y2="${height - bottom}" stroke="#ddd"/>`);
    out.push(`<text x="${px(x)}" y="${height - bottom + 18}" text-anchor="middle">${fmt(x)}</text>`);
  }
  for (const y of ys) {
    out.push(`<line x1="${left}" y1="${py(y)}" x2="${width - right}" y2="${py(y)}" stroke="#ddd"/>`);
    out.push(`<text x="${left - 6}" y="${(Number(py(y)) + 4).toFixed(1)}" text-anchor="end">${fmt(y)}</text>`);
  }
  out.push(`<path d="M${left} ${top} V${height - bottom} H${width - right}" fill="none" stroke="black"/>`);
  out.push(`<text x="${(left + width - right) / 2}" y="${height - bottom + 40}" text-anchor="middle">depth (m)</text>`);
  out.push(`<text transform="translate(22 ${(top + height - bottom) / 2}) rotate(-90)" text-anchor="middle">` +
    'steel volume (m³)</text>');
  // Gusset's palette (engine/render/style.go), told apart by dash too.
  const colours = ['#2b1d72', '#c96f00', '#007a6c', '#262626'];
  const dashes = ['none', '9 3 2 3', '5 3', '1.5 3'];
  PANELS.forEach((panels, k) => {
    const line = rows.filter((r) => r.panels === panels);
    const points = line.map((r) => `${px(r.depth_m)},${py(r.volume_m3)}`).join(' ');
    out.push(`<polyline points="${points}" fill="none" stroke="${colours[k]}" stroke-dasharray="${dashes[k]}" stroke-width="2"/>`);
    for (const r of line) out.push(`<circle cx="${px(r.depth_m)}" cy="${py(r.volume_m3)}" r="3" fill="${colours[k]}"/>`);
    const ly = top + 20 + 22 * k; // the legend, right of the plot
    out.push(`<line x1="${width - right + 20}" y1="${ly}" x2="${width - right + 50}" y2="${ly}" ` +
      `stroke="${colours[k]}" stroke-dasharray="${dashes[k]}" stroke-width="2"/>`);
    out.push(`<text x="${width - right + 58}" y="${ly + 4}">${panels} panels</text>`);
  });
  out.push(`<text x="${left}" y="${height - 20}" font-style="italic">${CAUTION}</text>`);
  out.push('</svg>');
  return out.join('\n') + '\n';
}

async function main() {
  const folder = process.argv[2] || process.env.GUSSET_EXAMPLES_OUT || mkdtempSync(path.join(tmpdir(), 'gusset-walkway-'));
  mkdirSync(folder, { recursive: true });
  const client = new Client();
  let rows;
  try {
    // Every request goes out at once over the one process; the client pairs
    // each answer with its request, and Promise.all keeps the table's order.
    rows = await Promise.all(PANELS.flatMap((n) => DEPTHS.map((h) => evaluate(client, n, h))));
  } finally {
    await client.close();
  }

  const columns = Object.keys(rows[0]);
  const table = path.join(folder, 'walkway-variants.csv');
  writeFileSync(table, [columns.join(','), ...rows.map((r) => columns.map((c) => r[c]).join(','))].join('\n') + '\n');
  const picture = path.join(folder, 'walkway-volume.svg');
  writeFileSync(picture, chart(rows));

  const best = rows.reduce((b, r) => (r.volume_m3 < b.volume_m3 ? r : b));
  console.log(`${rows.length} variants sent; least steel: ${best.panels} panels, ${best.depth_m.toFixed(2)} m deep, ` +
    `${best.volume_m3.toFixed(4)} m³ (${best.mass_kg.toFixed(0)} kg, ${best.carbon_kgCO2e.toFixed(0)} kg CO2e)`);
  console.log('table:', table);
  console.log('chart:', picture);
  console.log(CAUTION);
}

main().catch((err) => {
  console.error(err instanceof GussetNotFound ? err.message : err);
  process.exitCode = 1;
});
