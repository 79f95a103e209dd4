// Tests of the mapping from wire errors to error classes, and of finding the binary.

import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { chmodSync, mkdtempSync, realpathSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, test } from 'node:test';

import * as gusset from '../src/index.js';
import { binary } from '../testing/fixtures.js';

describe('error classes', () => {
  test('one per code of the published schema', (t) => {
    // The codes come from the published schema's ErrorCode definition
    // (`gusset schema`), the one table the server's codes and these classes
    // are generated from; the reserved codes are JSON-RPC 2.0's (section 5.1).
    const bin = binary();
    if (!bin) return t.skip('no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset');
    const table = JSON.parse(execFileSync(bin, ['schema'], { encoding: 'utf8' })).$defs.ErrorCode.oneOf;
    assert.ok(table.length >= 20);
    for (const { const: code, title: kind } of table) {
      const type = gusset.errorClass(code);
      assert.equal(type.code, code, String(code));
      assert.equal(type.kind, kind, String(code));
      assert.equal(type.name, kind.split(' ').map((w) => w[0].toUpperCase() + w.slice(1)).join(''));
      assert.equal(gusset[type.name], type);
      const err = gusset.fromWire({ code, message: 'm', data: { kind: 'k', problems: [] } });
      assert.ok(err instanceof type && err instanceof gusset.GussetError && err instanceof Error);
      assert.equal(err.code, code);
      assert.equal(err.name, type.name);
    }
    assert.deepEqual(gusset.wireErrors.map((type) => type.code).sort(), table.map((e) => e.const).sort());
    assert.equal(gusset.errorClass(4242), gusset.GussetError);
  });

  test('fields', () => {
    const err = gusset.fromWire({
      code: 1002,
      message: 'The structure is a mechanism.',
      data: {
        kind: 'unstable structure',
        problems: [{ path: '/params/model/nodes/1', message: 'free to move in y' }],
        detail: { freedoms: [{ node: 'B', component: 'y' }] },
      },
    }, 7, 'solve');
    assert.equal(err.message, 'The structure is a mechanism.');
    assert.equal(err.kind, 'unstable structure');
    assert.deepEqual(err.problems, [{ path: '/params/model/nodes/1', message: 'free to move in y' }]);
    assert.equal(err.detail.freedoms[0].node, 'B');
    assert.equal(err.requestId, 7);
    assert.equal(err.method, 'solve');
  });

  test('malformed error objects', () => {
    for (const wire of [null, 'boom', {}, { code: 'x' }, { code: 1000, data: { problems: 'no' } }]) {
      const err = gusset.fromWire(wire);
      assert.ok(err instanceof gusset.GussetError);
      assert.ok(err.message);
    }
  });
});

describe('findBinary', { skip: process.platform === 'win32' && 'uses executable scripts' }, () => {
  const executable = () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'gusset-find-'));
    const file = path.join(dir, 'gusset');
    writeFileSync(file, '#!/bin/sh\n');
    chmodSync(file, 0o755);
    return { dir, file: realpathSync(file) };
  };

  test('order', () => {
    const [given, configured, onPath, built] = [executable(), executable(), executable(), executable()];
    const env = { GUSSET_BINARY: configured.file, PATH: onPath.dir };
    const hints = [built.file];
    assert.equal(realpathSync(gusset.findBinary(given.file, { env, hints })), given.file);
    assert.equal(realpathSync(gusset.findBinary(null, { env, hints })), configured.file);
    assert.equal(realpathSync(gusset.findBinary(null, { env: { PATH: onPath.dir }, hints })), onPath.file);
    assert.equal(realpathSync(gusset.findBinary(null, { env: { PATH: '' }, hints })), built.file);
  });

  test('nothing found says how to build', () => {
    const empty = mkdtempSync(path.join(tmpdir(), 'gusset-empty-'));
    assert.throws(() => gusset.findBinary(null, { env: { PATH: empty }, hints: [path.join(empty, 'gusset')] }), (err) => {
      assert.ok(err instanceof gusset.GussetNotFound);
      assert.ok(err.message.includes('go build -o gusset ./cmd/gusset'));
      assert.ok(err.message.includes('GUSSET_BINARY'));
      assert.equal(err.searched.length, 2);
      return true;
    });
  });

  test('a bad setting is not skipped over', () => {
    // A wrong GUSSET_BINARY is an error, not a reason to run some other gusset on PATH.
    const onPath = executable();
    assert.throws(() => gusset.findBinary(null, { env: { GUSSET_BINARY: '/nonexistent/gusset', PATH: onPath.dir }, hints: [] }),
      (err) => err instanceof gusset.GussetNotFound && err.message.includes('/nonexistent/gusset'));
  });
});
