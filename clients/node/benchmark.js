// benchmark measures the Node client's requests per second and its overhead.
//
// Usage: node benchmark.js [--binary PATH] [--requests N]
//
// For each small request (describe, and a one-bar solve when the binary has
// solve) it times, over one process started with --jobs 1:
//   raw        the request line written to the pipe and the answer line read
//              back, with no JSON work in Node: the server plus the pipe;
//   call       client.call one request at a time (latency);
//   pipelined  client.start for a batch of 64, then every result.
// The client's overhead per request is call minus raw. Wall times are the
// least of five rounds (other work on the machine only ever adds time); the
// CPU columns are this process's processor time per request in the raw and
// call modes, which other load inflates far less, so their difference is the
// steadier measure of the client's own cost.

import { spawn } from 'node:child_process';
import { parseArgs } from 'node:util';

import { Client, findBinary } from './src/index.js';

const ROUNDS = 5;

const BAR = {
  dimension: 2,
  materials: [{ id: 'steel', elastic_modulus: 2.1e8 }],
  sections: [{ id: 'rod', area: 1e-3 }],
  nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [4, 0] }],
  members: [{ id: 'AB', ends: ['A', 'B'], material: 'steel', section: 'rod' }],
  supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: ['y'] }],
  load_cases: [{ id: 'pull', loads: [{ node: 'B', force: [7, 0] }] }],
};

/**
 * timed returns the least wall µs per request over ROUNDS runs of run, which makes count requests.
 * @param {number} count @param {() => Promise<void>} run
 */
async function timed(count, run) {
  let best = Infinity;
  for (let i = 0; i < ROUNDS; i++) {
    const begun = performance.now();
    await run();
    best = Math.min(best, performance.now() - begun);
  }
  return (best * 1000) / count;
}

/**
 * cpuTimed returns this process's processor µs per request of run.
 * @param {number} count @param {() => Promise<void>} run
 */
async function cpuTimed(count, run) {
  const begun = process.cpuUsage();
  await run();
  const used = process.cpuUsage(begun);
  return (used.user + used.system) / count;
}

/** @param {string} binary @param {string} method @param {object|undefined} params @param {number} count */
async function rawPipe(binary, method, params, count) {
  const child = spawn(binary, ['serve', '--jobs', '1'], { stdio: ['pipe', 'pipe', 'inherit'] });
  let waiting = null;
  let buffered = '';
  child.stdout.setEncoding('utf8');
  child.stdout.on('data', (text) => {
    buffered += text;
    let nl;
    while ((nl = buffered.indexOf('\n')) !== -1) {
      buffered = buffered.slice(nl + 1);
      const wake = waiting;
      waiting = null;
      wake?.();
    }
  });
  const line = JSON.stringify({ jsonrpc: '2.0', id: 1, method, params: params ?? {} }) + '\n';
  const once = () => new Promise((resolve) => {
    waiting = resolve;
    child.stdin.write(line);
  });
  const run = async () => {
    for (let i = 0; i < count; i++) await once();
  };
  for (let i = 0; i < 50; i++) await once();
  const us = [await timed(count, run), await cpuTimed(count, run)];
  child.stdin.end();
  await new Promise((resolve) => child.once('close', resolve));
  return us;
}

/** @param {string} binary @param {string} method @param {object|undefined} params @param {number} count */
async function withClient(binary, method, params, count) {
  const client = new Client({ binary, jobs: 1 });
  try {
    for (let i = 0; i < 50; i++) await client.call(method, params);
    const sequential = async () => {
      for (let i = 0; i < count; i++) await client.call(method, params);
    };
    const pipelined = async () => {
      for (let i = 0; i < count; i += 64) {
        const calls = [];
        for (let j = 0; j < 64; j++) calls.push(client.call(method, params));
        await Promise.all(calls);
      }
    };
    return [await timed(count, sequential), await cpuTimed(count, sequential), await timed(Math.ceil(count / 64) * 64, pipelined)];
  } finally {
    await client.close();
  }
}

const { values } = parseArgs({ options: { binary: { type: 'string' }, requests: { type: 'string', default: '1000' } } });
const binary = findBinary(values.binary ?? null);
const count = Number(values.requests);
const probe = new Client({ binary });
const methods = await probe.methods();
await probe.close();
const cases = [['describe', undefined]];
if (methods.includes('solve')) cases.push(['solve', { model: BAR }]);
console.log(`Node ${process.version}, ${count} requests per round, best of ${ROUNDS} rounds, one process with --jobs 1`);
const row = (...cells) => cells.map((c, i) => (i === 0 ? String(c).padEnd(9) : String(c).padStart(9))).join(' ');
console.log(row('request', 'raw', 'call', 'pipeline', 'overhead', 'raw CPU', 'call CPU', 'CPU over'));
for (const [method, params] of cases) {
  const [raw, rawCpu] = await rawPipe(binary, method, params, count);
  const [call, cpu, pipelined] = await withClient(binary, method, params, count);
  console.log(row(method, ...[raw, call, pipelined, call - raw, rawCpu, cpu, cpu - rawCpu].map((x) => x.toFixed(1))));
}
console.log('all in µs per request (requests per second = 10⁶ / µs); overhead = call − raw');
