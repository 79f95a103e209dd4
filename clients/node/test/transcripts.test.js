// Replays testdata/transcripts through the Node client (STYLE.md: the clients
// replay the transcripts the Go tests check), with the same subset matching
// as cmd/gusset/transcript_test.go: the expected values in each
// NAME.want.json are derived by hand and name their source under "_source".
//
// The client numbers its own requests, so a transcript line is replayed only
// when the client can send it as it is: a JSON-RPC 2.0 request object with an
// id, a method other than cancel (which names the transcript's ids), object
// params with finite numbers, and an id used once. Lines that exercise the
// framing itself (not JSON, no method, notifications) stay with the Go tests.

import assert from 'node:assert/strict';
import { readFileSync, readdirSync } from 'node:fs';
import { test } from 'node:test';

import { Client, GussetError } from '../src/index.js';
import { binary } from '../testing/fixtures.js';

const bin = binary();
const skip = bin ? false : 'no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset';
const dir = new URL('../../../testdata/transcripts/', import.meta.url);

/** @param {unknown} v @returns {boolean} */
const finite = (v) => {
  if (typeof v === 'number') return Number.isFinite(v);
  if (Array.isArray(v)) return v.every(finite);
  if (v && typeof v === 'object') return Object.values(v).every(finite);
  return true;
};

/**
 * replayable returns [raw id, method, params] of the lines the client can send.
 * @param {string[]} lines
 * @returns {[string, string, object|undefined][]}
 */
function replayable(lines) {
  /** @type {[string, string, object|undefined][]} */
  const out = [];
  const seen = new Map();
  for (const line of lines) {
    let request;
    try {
      request = JSON.parse(line);
    } catch {
      continue;
    }
    if (!request || typeof request !== 'object' || Array.isArray(request) || request.jsonrpc !== '2.0' || !('id' in request)) continue;
    const rawId = JSON.stringify(request.id);
    seen.set(rawId, (seen.get(rawId) ?? 0) + 1);
    const { method, params } = request;
    if (typeof method !== 'string' || method === 'cancel') continue;
    if (params !== undefined && (params === null || typeof params !== 'object' || Array.isArray(params) || !finite(params))) continue;
    out.push([rawId, method, params]);
  }
  return out.filter(([rawId]) => seen.get(rawId) === 1);
}

/**
 * mismatch returns where got differs from the subset want, or null.
 * @param {any} want @param {any} got @param {string} [where]
 * @returns {string|null}
 */
function mismatch(want, got, where = '') {
  if (Array.isArray(want)) {
    if (!Array.isArray(got)) return `${where}: want an array, got ${JSON.stringify(got)}`;
    if (want.length > 0 && want[0] && typeof want[0] === 'object' && !Array.isArray(want[0]) && !('approx' in want[0])) {
      for (const [i, element] of want.entries()) {
        if (got.every((g) => mismatch(element, g) !== null)) return `${where}/${i}: no element matches ${JSON.stringify(element)}`;
      }
      return null;
    }
    if (want.length !== got.length) return `${where}: want ${want.length} elements, got ${got.length}`;
    for (const [i, w] of want.entries()) {
      const found = mismatch(w, got[i], `${where}/${i}`);
      if (found) return found;
    }
    return null;
  }
  if (want && typeof want === 'object') {
    if (typeof want.approx === 'number') {
      const rel = want.rel ?? 0;
      if (typeof got !== 'number' || Math.abs(got - want.approx) > rel * Math.abs(want.approx)) {
        return `${where}: want ${want.approx} within ${rel} relative, got ${JSON.stringify(got)}`;
      }
      return null;
    }
    if (!got || typeof got !== 'object' || Array.isArray(got)) return `${where}: want an object, got ${JSON.stringify(got)}`;
    for (const [key, value] of Object.entries(want)) {
      if (!(key in got)) return `${where}/${key}: missing`;
      const found = mismatch(value, got[key], `${where}/${key}`);
      if (found) return found;
    }
    return null;
  }
  if (typeof want === 'number') {
    if (typeof got !== 'number' || Math.abs(got - want) > 1e-12 + 1e-9 * Math.abs(want)) return `${where}: want ${want}, got ${JSON.stringify(got)}`;
    return null;
  }
  return want === got ? null : `${where}: want ${JSON.stringify(want)}, got ${JSON.stringify(got)}`;
}

/**
 * asResponse turns a settled call back into the wire response's fields.
 * @param {Promise<unknown>} result
 */
async function asResponse(result) {
  try {
    return { result: await result };
  } catch (err) {
    if (!(err instanceof GussetError)) throw err;
    /** @type {Record<string, unknown>} */
    const data = { kind: err.kind, problems: err.problems };
    if (err.detail !== null) data.detail = err.detail;
    return { error: { code: err.code, message: err.message, data } };
  }
}

test('the transcripts replay through the client', { skip }, async (t) => {
  const names = readdirSync(dir).filter((f) => f.endsWith('.in.jsonl')).sort();
  assert.ok(names.length > 0, 'no transcripts');
  const client = new Client({ binary: bin });
  try {
    for (const file of names) {
      const name = file.slice(0, -'.in.jsonl'.length);
      await t.test(name, async () => {
        const want = JSON.parse(readFileSync(new URL(`${name}.want.json`, dir), 'utf8'));
        assert.ok('_source' in want, 'the want file names no source');
        const lines = readFileSync(new URL(file, dir), 'utf8').split('\n');
        // asResponse handles each call's rejection at once, whatever order
        // the answers come in.
        const calls = replayable(lines).map(([rawId, method, params]) => [rawId, asResponse(client.call(method, params))]);
        let checked = 0;
        for (const [rawId, response] of calls) {
          const got = await response;
          if (!(rawId in want)) continue;
          const found = mismatch(want[rawId], got);
          assert.equal(found, null, `id ${rawId}: ${found}`);
          checked++;
        }
        assert.ok(checked > 0, 'no expected response could be replayed');
      });
    }
  } finally {
    await client.close();
  }
});
