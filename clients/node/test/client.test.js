// Tests of the Node client against the real binary.

import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { after, before, describe, test } from 'node:test';

import {
  Cancelled, Client, ClientClosed, GussetError, GussetNotFound, InvalidParams, MethodNotFound, ProcessDied,
  ProtocolError, RequestTimeout, UnstableStructure, errorClass,
} from '../src/index.js';
import { barModel, binary, fakeBinary, gridTruss, methods, stop } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const posix = process.platform !== 'win32';
let names = [];

/** @param {number} value @param {number} expected @param {number} rel */
const closeWithin = (value, expected, rel) => Math.abs(value - expected) <= rel * Math.abs(expected);

before(async () => {
  if (bin) names = await methods();
});

describe('describe', { skip }, () => {
  test('matches the published schema', async () => {
    // The schema id and params definitions are checked against `gusset
    // schema`, the published JSON Schema; describe and cancel are the methods
    // every server offers (DESIGN.md, "Wire protocol").
    const schema = JSON.parse(execFileSync(bin, ['schema'], { encoding: 'utf8' }));
    const client = new Client({ binary: bin });
    try {
      const info = await client.describe();
      assert.equal(info.name, 'gusset');
      assert.equal(info.schema_id, schema.$id);
      const methodNames = info.methods.map((m) => m.name);
      assert.ok(methodNames.includes('describe') && methodNames.includes('cancel'));
      for (const m of info.methods) assert.ok(m.params in schema.$defs, m.name);
    } finally {
      await client.close();
    }
  });
});

describe('pairing', { skip }, () => {
  test('concurrent requests get their own answers', async () => {
    // Each request's answer differs: describe, an unknown method whose error
    // names it, and (with solve) a pulled bar whose axial force equals the pull
    // by the equilibrium of node B and whose extension is PL/(EA) (Hooke's law;
    // Gere & Goodno, Mechanics of Materials, eq. 2-3, from memory).
    const hasSolve = names.includes('solve');
    const client = new Client({ binary: bin, jobs: 2 });
    try {
      const jobs = [];
      for (let i = 0; i < 300; i++) {
        const kind = i % 3;
        if (kind === 0) {
          jobs.push(client.describe().then((info) => assert.equal(info.name, 'gusset')));
        } else if (kind === 1 || !hasSolve) {
          const name = `no-such-method-${i}`;
          jobs.push(client.call(name).then(
            () => assert.fail('an unknown method succeeded'),
            (err) => {
              assert.ok(err instanceof MethodNotFound);
              assert.ok(err.message.includes(name), err.message);
            }));
        } else {
          const pull = 1 + i;
          jobs.push(client.solve(barModel(pull)).then((result) => {
            const c = result.cases[0];
            assert.ok(closeWithin(c.axial_forces[0], pull, 1e-9), `${c.axial_forces[0]} vs ${pull}`);
            assert.ok(closeWithin(c.displacements[1][0], (pull * 4) / (2.1e8 * 1e-3), 1e-9));
          }));
        }
      }
      await Promise.all(jobs);
      const first = client.start('describe');
      const second = client.start('describe');
      assert.ok(first.id < second.id);
      await Promise.all([first.result(), second.result()]);
    } finally {
      await client.close();
    }
  });
});

describe('errors', { skip }, () => {
  let client;
  before(() => { client = new Client({ binary: bin }); });
  after(() => client.close());

  test('a schema error carries its pointer', async () => {
    // -32602 is invalid params in JSON-RPC 2.0 (specification, section 5.1).
    await assert.rejects(client.call('cancel', { request: [1] }), (err) => {
      assert.ok(err instanceof InvalidParams && err instanceof GussetError);
      assert.equal(err.code, -32602);
      assert.equal(err.kind, 'invalid params');
      assert.ok(err.problems.some((p) => p.path === '/params/request'));
      assert.ok(String(err).includes('/params/request'));
      return true;
    });
  });

  test('an unknown method', async () => {
    // -32601 is method not found in JSON-RPC 2.0 (specification, section 5.1).
    await assert.rejects(client.call('frobnicate'), (err) => {
      assert.ok(err instanceof MethodNotFound);
      assert.equal(err.code, -32601);
      assert.deepEqual(err.problems.map((p) => p.path), ['/method']);
      return true;
    });
  });

  test('a dangling node points at the member end', async (t) => {
    if (!names.includes('solve')) return t.skip('solve is not registered in this binary');
    const model = barModel(7);
    model.members[0].ends = ['A', 'Z'];
    await assert.rejects(client.solve(model), (err) => {
      assert.ok([1000, -32602].includes(err.code), String(err));
      assert.ok(err instanceof errorClass(err.code));
      assert.ok(err.problems.some((p) => p.path === '/params/model/members/0/ends/1'), String(err));
      return true;
    });
  });

  test('a mechanism is an unstable structure', async (t) => {
    // A bar pinned at one end only and loaded across itself turns about the
    // pin: a mechanism (Maxwell's rule, b - 2j + k = 1 - 4 + 2 < 0).
    if (!names.includes('solve')) return t.skip('solve is not registered in this binary');
    const model = barModel(7);
    model.supports = [{ node: 'A', fix: ['x', 'y'] }];
    model.load_cases[0].loads[0].force = [0, -5];
    await assert.rejects(client.solve(model), (err) => {
      assert.ok(err instanceof UnstableStructure);
      assert.equal(err.code, 1002);
      assert.ok(err.detail);
      return true;
    });
  });
});

describe('cancel', { skip }, () => {
  test('of a finished request', async () => {
    const client = new Client({ binary: bin });
    try {
      const call = client.start('describe');
      await call.result();
      assert.equal(await call.cancel(), false);
      assert.equal(await client.cancel(987654), false);
    } finally {
      await client.close();
    }
  });

  test('in flight', async (t) => {
    if (!names.includes('solve')) return t.skip('solve is not registered: no request lasts long enough to cancel');
    const client = new Client({ binary: bin });
    try {
      const call = client.start('solve', { model: gridTruss(60) });
      assert.equal(await call.cancel(), true);
      await assert.rejects(call.result(), (err) => err instanceof Cancelled && err.code === -32000);
      assert.equal((await client.describe()).name, 'gusset');
    } finally {
      await client.close();
    }
  });

  test('by an AbortSignal', async (t) => {
    if (!names.includes('solve')) return t.skip('solve is not registered: no request lasts long enough to cancel');
    const client = new Client({ binary: bin });
    try {
      const controller = new AbortController();
      const pending = client.solve(gridTruss(60), { signal: controller.signal });
      controller.abort(new Error('the host lost interest'));
      await assert.rejects(pending, (err) => {
        assert.ok(err instanceof Cancelled);
        assert.equal(err.cause.message, 'the host lost interest');
        return true;
      });
      await assert.rejects(client.describe({ signal: AbortSignal.abort() }), Cancelled);
      assert.equal((await client.describe()).name, 'gusset');
    } finally {
      await client.close();
    }
  });
});

describe('streaming', { skip }, () => {
  test('progress comes before the result', async (t) => {
    if (!names.includes('solve')) return t.skip('solve is not registered in this binary');
    const client = new Client({ binary: bin });
    try {
      const call = client.start('solve', { model: gridTruss(60) });
      const seen = [];
      for await (const p of call) seen.push(p);
      assert.ok(call.done);
      assert.ok(seen.length > 0);
      for (const p of seen) {
        assert.equal(p.request, call.id);
        assert.ok(p.stage);
        assert.ok(p.total === 0 || p.done <= p.total);
      }
      assert.equal((await call.result()).cases.length, 1);
    } finally {
      await client.close();
    }
  });

  test('sweep steps stream', async (t) => {
    // A single bar carrying axial force N over length L has load path |N|·L
    // (Maxwell, "On reciprocal figures, frames, and diagrams of forces", 1870;
    // the load path is the sum of |force| × length), and a bar pulled by P
    // carries N = P, so the load path is P·span.
    if (!names.includes('sweep-parameter')) return t.skip('sweep-parameter is not registered in this binary');
    const pull = 10;
    const model = barModel(pull);
    model.parameters = { span: 4 };
    model.nodes[1].at = ['span', 0];
    const spans = [2, 3, 4, 5, 6];
    const client = new Client({ binary: bin });
    try {
      const sweep = client.sweep(model, { name: 'span', values: spans }, { metrics: ['load_path'] });
      const streamed = [];
      for await (const step of sweep) streamed.push(step);
      const result = await sweep.result();
      assert.deepEqual(streamed.map((s) => s.index).sort((a, b) => a - b), [0, 1, 2, 3, 4]);
      for (const step of streamed) {
        const span = step.values[0];
        assert.equal(span, spans[step.index]);
        assert.ok(closeWithin(step.metrics.load_path, pull * span, 1e-9), JSON.stringify(step));
      }
      assert.deepEqual(result.steps.map((s) => s.index), [0, 1, 2, 3, 4]);
      const fromCallback = [];
      const final = await client.sweepParameter(model, { name: 'span', values: spans },
        { metrics: ['load_path'], onStep: (step) => fromCallback.push(step) });
      assert.equal(fromCallback.length, spans.length);
      assert.deepEqual(final.steps, result.steps);
    } finally {
      await client.close();
    }
  });
});

describe('timeouts', { skip }, () => {
  test('a timeout cancels and the client goes on', async (t) => {
    if (!names.includes('solve')) return t.skip('solve is not registered: no request lasts long enough');
    const client = new Client({ binary: bin });
    try {
      const begun = performance.now();
      await assert.rejects(client.call('solve', { model: gridTruss(60) }, { timeout: 50 }), RequestTimeout);
      assert.ok(performance.now() - begun < 2000);
      assert.equal((await client.describe()).name, 'gusset');
    } finally {
      await client.close();
    }
  });

  test('an answer that never comes', { skip: !posix && 'needs SIGSTOP' }, async () => {
    const client = new Client({ binary: bin });
    try {
      await client.describe();
      await stop(client.pid);
      try {
        const begun = performance.now();
        await assert.rejects(client.describe({ timeout: 200 }), RequestTimeout);
        const elapsed = performance.now() - begun;
        assert.ok(elapsed >= 190 && elapsed < 2000, `${elapsed} ms`);
      } finally {
        process.kill(client.pid, 'SIGCONT');
      }
      assert.equal((await client.describe({ timeout: 5000 })).name, 'gusset');
    } finally {
      await client.close();
    }
  });
});

describe('the process', () => {
  test('a missing binary says how to build it', () => {
    assert.throws(() => new Client({ binary: '/nonexistent/gusset' }), (err) => {
      assert.ok(err instanceof GussetNotFound);
      assert.ok(err.message.includes('go build -o gusset ./cmd/gusset'));
      return true;
    });
  });

  test('killed mid-request, then restarted', { skip: skip || (!posix && 'needs signals') }, async () => {
    const client = new Client({ binary: bin });
    try {
      const first = client.pid;
      await stop(first); // so the request is surely in flight
      const call = client.start('describe');
      process.kill(first, 'SIGKILL');
      await assert.rejects(call.result(), (err) => {
        assert.ok(err instanceof ProcessDied);
        assert.equal(err.signal, 'SIGKILL');
        assert.ok(err.message.includes('SIGKILL'));
        return true;
      });
      assert.equal((await client.describe()).name, 'gusset');
      assert.notEqual(client.pid, first);
    } finally {
      await client.close();
    }
  });

  test('death reports the stderr tail', { skip: !posix && 'fake binaries are scripts' }, async () => {
    const client = new Client({ binary: fakeBinary(), args: ['--mode', 'die'] });
    try {
      await assert.rejects(client.describe({ timeout: 5000 }), (err) => {
        assert.ok(err instanceof ProcessDied);
        assert.equal(err.exitCode, 3);
        assert.ok(err.stderr.includes('fatal: the fake server gives up'));
        assert.ok(err.message.includes('fatal: the fake server gives up'));
        return true;
      });
    } finally {
      await client.close();
    }
  });

  test('a non-JSON line is reported', { skip: !posix && 'fake binaries are scripts' }, async () => {
    const warnings = [];
    const client = new Client({ binary: fakeBinary(), args: ['--mode', 'garbage'], onWarning: (w) => warnings.push(w) });
    try {
      await assert.rejects(client.describe({ timeout: 5000 }), (err) => {
        assert.ok(err instanceof ProtocolError);
        assert.equal(err.line, 'this line is not JSON');
        return true;
      });
      assert.ok(warnings.some((w) => w.includes('this line is not JSON')), warnings.join('\n'));
    } finally {
      await client.close();
    }
  });

  test('close waits for the answers in flight', { skip: !posix && 'fake binaries are scripts' }, async () => {
    const client = new Client({ binary: fakeBinary(), args: ['--mode', 'slow'] });
    const call = client.start('describe');
    await client.close();
    assert.ok(call.done);
    assert.deepEqual(await call.result(), { method: 'describe' });
    assert.equal(client.pid, null);
    assert.throws(() => client.start('describe'), ClientClosed);
    await assert.rejects(client.describe(), ClientClosed);
  });

  test('a script that forgets close still ends', { skip }, () => {
    // The process must not keep Node's event loop alive while nothing is in flight.
    const script = `import { Client } from ${JSON.stringify(new URL('../src/index.js', import.meta.url).href)};
      const client = new Client({ binary: ${JSON.stringify(bin)} });
      console.log((await client.describe()).name);`;
    const out = execFileSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8', timeout: 10000 });
    assert.equal(out.trim(), 'gusset');
  });
});

describe('optimiseLayout', { skip }, () => {
  test('a joint cost switches the layout', async (t) => {
    // A load P = 1 hanging below pins at (-1, 1), (1, 1) and (0, 2.5): two
    // ties at 45° need volume 2P/σ and cost 2 + √2·s with a joint cost s
    // per member, the vertical tie 2.5P/σ and 2.5 + s (hand results from
    // equilibrium at the loaded node; the joint cost after Parkes 1975, from
    // memory).
    if (!names.includes('optimise-layout')) return t.skip('optimise-layout not offered');
    const problem = {
      nodes: [[0, 0], [-1, 1], [1, 1], [0, 2.5]],
      supports: [[-1, 1], [1, 1], [0, 2.5]].map((at) => ({ at, fix: ['x', 'y'] })),
      cases: [{ id: 'P', loads: [{ at: [0, 0], force: [0, -1] }] }],
      tension_limit: 1,
      compression_limit: 1,
    };
    const client = new Client({ binary: bin });
    try {
      const plain = await client.optimiseLayout(problem);
      const costly = await client.optimiseLayout({ ...problem, joint_cost: 2 });
      assert.equal(plain.members.length, 2);
      assert.ok(closeWithin(plain.volume, 2, 1e-7), String(plain.volume));
      assert.equal(costly.members.length, 1);
      assert.ok(closeWithin(costly.volume, 2.5, 1e-7), String(costly.volume));
      assert.ok(closeWithin(costly.objective, 4.5, 1e-7), String(costly.objective));
    } finally {
      await client.close();
    }
  });

  test('a tripod in space', async (t) => {
    // A load P = 10 down at the origin hangs from supports (2, 1, 2),
    // (−2, 1, 2), (1, −2, 2), each 3 away: equilibrium of the loaded node
    // gives N = 3.75, 6.25 and 5 (all tension), volume 15·3 = 45 with σ = 1
    // (hand result; the dual bound that no layout over these nodes needs
    // less is derived in testdata/transcripts/layout-tripod.want.json).
    if (!names.includes('optimise-layout')) return t.skip('optimise-layout not offered');
    const legs = [[2, 1, 2], [-2, 1, 2], [1, -2, 2]];
    const rounds = [];
    const client = new Client({ binary: bin });
    try {
      const lay = await client.optimiseLayout({
        dimension: 3,
        nodes: [[0, 0, 0], ...legs, [0, 0, 1], [0, 0, 2], [1, 0, 1]],
        supports: legs.map((at) => ({ at, fix: ['x', 'y', 'z'] })),
        cases: [{ id: 'hang', loads: [{ at: [0, 0, 0], force: [0, 0, -10] }] }],
        tension_limit: 1,
        compression_limit: 1,
        onRound: (r) => rounds.push(r),
      });
      assert.ok(closeWithin(lay.volume, 45, 1e-7), String(lay.volume));
      const forces = lay.members.map((m) => m.forces[0]).sort((a, b) => a - b);
      [3.75, 5, 6.25].forEach((want, i) => assert.ok(closeWithin(forces[i], want, 1e-7), String(forces)));
      assert.equal(lay.model.dimension, 3);
      assert.ok(rounds.length >= 1);
      assert.equal(rounds[rounds.length - 1].added, 0);
    } finally {
      await client.close();
    }
  });
});

describe('findForm', { skip }, () => {
  test('a hanging chain in closed form', async (t) => {
    // A chain of 4 unit panels under P = 10 at its inner nodes with q = 5
    // hangs at y_i = (P/2q)·i·(i − n) = i(i − 4): −3, −4, −3 (closed form of
    // the funicular polygon, derived in the Go tests). Maxwell's theorem
    // (Maxwell 1870) gives its load path: all in tension, Z = M =
    // P·(3 + 4 + 3) + H·4 with H = q·1 = 5, so 120.
    if (!names.includes('find-form')) return t.skip('find-form not offered');
    const ids = ['A', 'B', 'C', 'D', 'E'];
    const model = {
      dimension: 2,
      materials: [{ id: 'rope', elastic_modulus: 1e8 }],
      sections: [{ id: 's', area: 1e-4 }],
      nodes: ids.map((id, i) => ({ id, at: [i, 0] })),
      members: ids.slice(1).map((b, i) => ({ id: ids[i] + b, ends: [ids[i], b], material: 'rope', section: 's' })),
      supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'E', fix: ['x', 'y'] }],
      load_cases: [{ id: 'hang', loads: ['B', 'C', 'D'].map((node) => ({ node, force: [0, -10] })) }],
    };
    const client = new Client({ binary: bin });
    try {
      const found = await client.findForm(model, { force_density: 5 });
      const again = await client.loadPath(found.model, { cases: [found.model_case], forces: found.forces });
      const heights = found.coordinates.map((p) => p[1]);
      [0, -3, -4, -3, 0].forEach((want, i) => assert.ok(closeWithin(heights[i], want, 1e-12), String(heights)));
      assert.equal(found.network, 'tension');
      assert.ok(closeWithin(found.load_path.load_path, 120, 1e-12), String(found.load_path.load_path));
      assert.ok(closeWithin(again.cases[0].load_path, 120, 1e-12), String(again.cases[0].load_path));
    } finally {
      await client.close();
    }
  });
});

describe('modes', { skip }, () => {
  test('a spring-held strut buckles at kL/P and sways at √(k/M)', async (t) => {
    // A rigid strut L = 4 pinned at its foot, its head held sideways by a
    // spring k = 50 and loaded by P = 10: λ = k·L/P = 20 (Timoshenko and
    // Gere, Theory of Elastic Stability, 1961, §1.1; from memory); with a
    // mass M = 2 at the head, ω = √(k/M) = 5 rad/s.
    if (!names.includes('modes')) return t.skip('modes not offered');
    const model = {
      dimension: 2,
      materials: [{ id: 'steel', elastic_modulus: 2.1e8 }],
      sections: [{ id: 'rod', area: 0.002 }],
      nodes: [{ id: 'A', at: [0, 0] }, { id: 'B', at: [0, 4], mass: 2 }],
      members: [{ id: 'AB', ends: ['A', 'B'], material: 'steel', section: 'rod' }],
      supports: [{ node: 'A', fix: ['x', 'y'] }, { node: 'B', fix: [], springs: { x: 50 } }],
      load_cases: [{ id: 'down', loads: [{ node: 'B', force: [0, -10] }] }],
    };
    const client = new Client({ binary: bin });
    try {
      const buckling = await client.modes(model, 'buckling', { count: 1 });
      const vibration = await client.modes(model, 'vibration', { count: 1 });
      assert.ok(closeWithin(buckling.critical_factor, 20, 1e-9), String(buckling.critical_factor));
      assert.ok(closeWithin(vibration.modes[0].angular_frequency, 5, 1e-9), String(vibration.modes[0].angular_frequency));
      assert.match(buckling.caution, /imperfections/);
    } finally {
      await client.close();
    }
  });
});
