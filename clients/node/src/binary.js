// Finding the gusset binary.

import { accessSync, constants, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

import { GussetNotFound } from './errors.js';

/** BUILD_HINT says how to build the binary; it ends every GussetNotFound message. */
export const BUILD_HINT =
  'Build it from the root of the Gusset repository with:\n' +
  '    go build -o gusset ./cmd/gusset\n' +
  'then pass its path as new Client({binary}), set GUSSET_BINARY to it, or put it on PATH.';

const exe = process.platform === 'win32' ? 'gusset.exe' : 'gusset';

/**
 * defaultHints returns the build locations tried last: the root of the
 * repository this client sits in (clients/node/src is three levels down),
 * where `go build -o gusset ./cmd/gusset` leaves the binary.
 * @returns {string[]}
 */
export function defaultHints() {
  return [fileURLToPath(new URL(`../../../${exe}`, import.meta.url))];
}

/** @param {string} file */
function runnable(file) {
  try {
    if (!statSync(file).isFile()) return false;
    accessSync(file, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

/**
 * @param {string} name
 * @param {string} searchPath
 * @returns {string|null}
 */
function onPath(name, searchPath) {
  const names = process.platform === 'win32' ? [name, `${name}.exe`] : [name];
  for (const dir of searchPath.split(path.delimiter)) {
    if (!dir) continue;
    for (const n of names) {
      const candidate = path.join(dir, n);
      if (runnable(candidate)) return candidate;
    }
  }
  return null;
}

/**
 * findBinary returns the path of the gusset binary to start. It tries, in
 * order: `binary` when given (a path, or a name looked up on PATH), the
 * GUSSET_BINARY environment variable, `gusset` on PATH, and the build hints.
 * @param {string|null} [binary]
 * @param {{env?: Record<string, string|undefined>, hints?: string[]}} [options]
 *   env replaces process.env and hints the build locations, for tests.
 * @returns {string}
 * @throws {GussetNotFound} when nothing runnable is found; the message lists
 *   what was tried and how to build the binary.
 */
export function findBinary(binary = null, { env = process.env, hints = defaultHints() } = {}) {
  const searched = [];
  const searchPath = env.PATH ?? '';
  /** @param {string} name @param {string} origin */
  const resolve = (name, origin) => {
    searched.push(`${origin}: ${name}`);
    if (runnable(name)) return path.resolve(name);
    if (!name.includes('/') && !name.includes(path.sep)) return onPath(name, searchPath);
    return null;
  };
  if (binary != null) {
    const found = resolve(String(binary), 'the binary option');
    if (found) return found;
    throw new GussetNotFound(`The gusset binary ${JSON.stringify(String(binary))} given to Client does not exist or is not executable.\n${BUILD_HINT}`, searched);
  }
  if (env.GUSSET_BINARY) {
    const found = resolve(env.GUSSET_BINARY, 'GUSSET_BINARY');
    if (found) return found;
    throw new GussetNotFound(`GUSSET_BINARY is set to ${JSON.stringify(env.GUSSET_BINARY)}, which does not exist or is not executable.\n${BUILD_HINT}`, searched);
  }
  searched.push('PATH: gusset');
  const found = onPath('gusset', searchPath);
  if (found) return found;
  for (const hint of hints) {
    searched.push(`build location: ${hint}`);
    if (runnable(hint)) return path.resolve(hint);
  }
  throw new GussetNotFound(`The gusset binary was not found (looked at: ${searched.join('; ')}).\n${BUILD_HINT}`, searched);
}
