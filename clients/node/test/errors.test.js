// Tests of the mapping from wire errors to error classes, and of finding the binary.

import assert from 'node:assert/strict';
import { chmodSync, mkdtempSync, realpathSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, test } from 'node:test';

import * as gusset from '../src/index.js';

describe('error classes', () => {
  test('one per code', () => {
    // JSON-RPC's reserved codes come from the JSON-RPC 2.0 specification
    // (section 5.1); the server's own and the application codes from
    // /work/shared/DESIGN.md, "Wire protocol", and protocol/message.go.
    const table = [
      [-32700, gusset.ParseError], [-32600, gusset.InvalidRequest], [-32601, gusset.MethodNotFound],
      [-32602, gusset.InvalidParams], [-32603, gusset.InternalError], [-32000, gusset.Cancelled],
      [-32001, gusset.LimitExceeded], [-32002, gusset.Overloaded], [-32003, gusset.ShuttingDown],
      [-32004, gusset.TimeLimit], [1000, gusset.InvalidModel], [1001, gusset.ExpressionError],
      [1002, gusset.UnstableStructure], [1003, gusset.NotPlanar], [1004, gusset.NotInEquilibrium],
      [1005, gusset.WrongDimension], [1006, gusset.MissingData], [1007, gusset.Infeasible],
      [1008, gusset.NoSolution], [1009, gusset.UnknownCase],
    ];
    for (const [code, type] of table) {
      assert.equal(gusset.errorClass(code), type, String(code));
      const err = gusset.fromWire({ code, message: 'm', data: { kind: 'k', problems: [] } });
      assert.ok(err instanceof type && err instanceof gusset.GussetError && err instanceof Error);
      assert.equal(err.code, code);
      assert.equal(err.name, type.name);
    }
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
