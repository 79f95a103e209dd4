// Shared helpers of the client tests: the binary under test, models and fake
// servers. It lives outside test/ because node --test runs every file there.

import { execFileSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

import { Client, GussetNotFound, findBinary } from '../src/index.js';

let built = null;

/**
 * binary returns the gusset binary under test: GUSSET_BINARY when set (the Go
 * test sets it), else the one the client itself would find, else one built now
 * with the go command from this checkout; null when there is none.
 * @returns {string|null}
 */
export function binary() {
  try {
    return findBinary();
  } catch (err) {
    if (!(err instanceof GussetNotFound) || process.env.GUSSET_BINARY) throw err;
  }
  if (built) return built;
  const root = fileURLToPath(new URL('../../../', import.meta.url));
  if (!existsSync(path.join(root, 'go.mod'))) return null;
  const out = path.join(mkdtempSync(path.join(tmpdir(), 'gusset-nodetest-')), 'gusset');
  try {
    execFileSync('go', ['build', '-o', out, './cmd/gusset'], { cwd: root, stdio: 'inherit' });
  } catch {
    return null;
  }
  built = out;
  return built;
}

let methodNames = null;

/**
 * methods resolves with the methods the binary under test offers.
 * @returns {Promise<string[]>}
 */
export async function methods() {
  if (!methodNames) {
    const client = new Client({ binary: binary() });
    try {
      methodNames = await client.methods();
    } finally {
      await client.close();
    }
  }
  return methodNames;
}

/**
 * barModel is one bar along x, pinned at A, on a roller at B, pulled at B by `pull` along +x.
 * @param {number} pull
 */
export function barModel(pull, { length = 4, modulus = 2.1e8, area = 1e-3 } = {}) {
  return {
    dimension: 2,
    units: { length: 'm', force: 'kN' },
    materials: [{ id: 'steel', elastic_modulus: modulus }],
    sections: [{ id: 'rod', area }],
    nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [length, 0] }],
    members: [{ id: 'AB', ends: ['A', 'B'], material: 'steel', section: 'rod' }],
    supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['y'] }],
    load_cases: [{ id: 'pull', loads: [{ node: 'B', force: [pull, 0] }] }],
  };
}

/**
 * gridTruss is an n×n braced square grid on a pinned base: a model big enough to take a while.
 * @param {number} n
 */
export function gridTruss(n) {
  const node = (i, j) => `n${i}_${j}`;
  const nodes = [];
  const members = [];
  for (let i = 0; i <= n; i++) {
    for (let j = 0; j <= n; j++) {
      nodes.push({ id: node(i, j), at: [i, j] });
      const ends = [];
      if (i < n) ends.push([node(i, j), node(i + 1, j)]);
      if (j < n) ends.push([node(i, j), node(i, j + 1)]);
      if (i < n && j < n) ends.push([node(i, j), node(i + 1, j + 1)]);
      for (const [a, b] of ends) members.push({ id: `${a}-${b}`, ends: [a, b], material: 'steel', section: 'rod' });
    }
  }
  const base = [];
  const top = [];
  for (let i = 0; i <= n; i++) {
    base.push({ node: node(i, 0), fix: ['x', 'y'] });
    top.push({ node: node(i, n), force: [1, -1] });
  }
  return {
    dimension: 2,
    materials: [{ id: 'steel', elastic_modulus: 2.1e8 }],
    sections: [{ id: 'rod', area: 1e-3 }],
    nodes,
    members,
    supports: base,
    load_cases: [{ id: 'wind', loads: top }],
  };
}

const FAKE_SERVER = `
import { createInterface } from 'node:readline';
const mode = process.argv[process.argv.indexOf('--mode') + 1];
const lines = createInterface({ input: process.stdin });
lines.on('line', async (line) => {
  const message = JSON.parse(line);
  if (mode === 'garbage') process.stdout.write('this line is not JSON\\n');
  if (mode === 'die') {
    process.stderr.write('fatal: the fake server gives up\\n', () => process.exit(3));
    return;
  }
  if (mode === 'slow') await new Promise((resolve) => setTimeout(resolve, 200));
  process.stdout.write(JSON.stringify({ jsonrpc: '2.0', id: message.id, result: { method: message.method } }) + '\\n');
});
`;

/**
 * fakeBinary writes a tiny stand-in server into a new temporary directory and
 * returns its path. With --mode garbage it writes a non-JSON line before each
 * answer; with --mode die it writes to stderr and exits at the first request;
 * with --mode slow it answers after 200 ms.
 * @returns {string}
 */
export function fakeBinary() {
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'gusset-fake-')), 'fake-gusset.mjs');
  writeFileSync(file, `#!${process.execPath}\n${FAKE_SERVER}`);
  chmodSync(file, 0o755);
  return file;
}

/**
 * stop sends SIGSTOP and resolves once every thread of the process has
 * stopped: kill returns before a busy multi-threaded process has finished
 * stopping, and a request sent in that window could still be answered.
 * @param {number} pid
 */
export async function stop(pid) {
  process.kill(pid, 'SIGSTOP');
  const tasks = `/proc/${pid}/task`;
  if (!existsSync(tasks)) {
    await new Promise((resolve) => setTimeout(resolve, 200));
    return;
  }
  const deadline = Date.now() + 5000;
  while (Date.now() < deadline) {
    const states = [];
    for (const task of readdirSync(tasks)) {
      try {
        states.push(readFileSync(`${tasks}/${task}/stat`, 'utf8').split(')').pop().trim().split(' ')[0]);
      } catch {
        // The thread ended meanwhile.
      }
    }
    if (states.length > 0 && states.every((s) => s === 'T' || s === 't')) return;
    await new Promise((resolve) => setTimeout(resolve, 5));
  }
  throw new Error(`process ${pid} did not stop within 5 s`);
}
