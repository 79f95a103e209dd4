// Client drives one `gusset serve` process over its standard input and output.

import { spawn } from 'node:child_process';

import { findBinary } from './binary.js';
import {
  Cancelled, ClientClosed, GussetError, GussetNotFound, LimitExceeded, ProcessDied, ProtocolError,
  RequestTimeout, fromWire,
} from './errors.js';

/**
 * One progress notification of a request.
 * @typedef {object} Progress
 * @property {number|string} request The request's id.
 * @property {string} stage The phase ("ordering", "factorising", "step", ...).
 * @property {number} done Finished units of the stage.
 * @property {number} total Units in the stage (0 when unknown).
 * @property {unknown} partial An intermediate result (for a sweep, the step just computed), or undefined.
 */

/**
 * Options of one request.
 * @typedef {object} RequestOptions
 * @property {number} [timeout] Milliseconds to wait for the answer, counted
 *   from sending; default the client's timeout. On expiry the request is
 *   cancelled and fails with RequestTimeout.
 * @property {AbortSignal} [signal] Aborting it cancels the request, which
 *   then fails with Cancelled (its cause is the signal's reason).
 * @property {(progress: Progress) => void} [onProgress] Called with each
 *   progress notification as it arrives.
 * @property {boolean} [keepProgress] Queue the notifications for async
 *   iteration over the call (default true for start, false for call).
 */

/**
 * Options of a Client.
 * @typedef {object} ClientOptions
 * @property {string} [binary] Path (or name on PATH) of the gusset binary;
 *   default GUSSET_BINARY, then gusset on PATH, then the repository's root.
 * @property {number} [jobs] Requests the server works on at once (--jobs).
 * @property {number} [timeLimit] The server's wall-time limit per request in
 *   seconds (--time-limit); exceeding it fails with TimeLimit.
 * @property {string[]} [args] Further flags of `gusset serve`.
 * @property {number} [timeout] The default timeout of each request in ms.
 * @property {Record<string, string|undefined>} [env] The process's environment.
 * @property {string} [cwd] The process's working directory.
 * @property {number} [stderrLines] How many last standard-error lines to keep for ProcessDied (default 50).
 * @property {(message: string) => void} [onWarning] Receives warnings (a
 *   garbled output line, an answer to an unknown id); default process.emitWarning.
 */

/** Lines above this size are checked against the server's line limit before sending. */
const CHECK_LINE_BYTES = 1 << 20;
const REQUEST_OPTIONS = new Set(['timeout', 'signal', 'onProgress', 'keepProgress']);
const END = Symbol('end');
const DEFAULT_LINE_LIMIT = 64 << 20; // the server's default --max-line-bytes

/**
 * lineLimitOf returns the line limit that the server's flags set.
 * @param {string[]} argv
 * @returns {number}
 */
function lineLimitOf(argv) {
  let limit = DEFAULT_LINE_LIMIT;
  argv.forEach((arg, i) => {
    const m = /^--?max-line-bytes(?:=(\d+))?$/.exec(arg);
    if (m) limit = Number(m[1] ?? argv[i + 1]) || limit;
  });
  return limit;
}

/**
 * Call is one request in flight, returned by Client.start. `for await` over
 * it yields its progress notifications as they arrive and ends when the final
 * answer has come (throwing the call's error if it failed); result() resolves
 * with the final result.
 */
export class Call {
  /**
   * @param {Client} client
   * @param {number} id
   * @param {string} method
   * @param {boolean} keepProgress
   * @param {((progress: Progress) => void)|undefined} onProgress
   */
  constructor(client, id, method, keepProgress, onProgress) {
    /** The request's JSON-RPC id. @readonly */
    this.id = id;
    /** The request's method. @readonly */
    this.method = method;
    this._client = client;
    this._keep = keepProgress;
    this._onProgress = onProgress;
    /** @type {Array<Progress|typeof END>} */
    this._queue = [];
    /** @type {(() => void)|null} */
    this._wake = null;
    this._done = false;
    /** @type {GussetError|null} */
    this._error = null;
    /** @type {Process|null} */
    this._process = null;
    /** @type {(() => void)[]} */
    this._cleanups = [];
    /** @type {(value: unknown) => void} */
    this._resolve = () => {};
    /** @type {(error: GussetError) => void} */
    this._reject = () => {};
    /** @type {Promise<any>} */
    this._promise = new Promise((resolve, reject) => {
      this._resolve = resolve;
      this._reject = reject;
    });
    // A failure is reported to whoever awaits result() or iterates; an
    // unobserved one must not crash the host as an unhandled rejection.
    this._promise.catch(() => {});
  }

  /** done is true once the final answer (or a failure) has arrived. */
  get done() {
    return this._done;
  }

  /**
   * result resolves with the request's result.
   * @returns {Promise<any>} rejects with the server's error (a subclass per
   *   code) or RequestTimeout, ProcessDied, ProtocolError, ClientClosed.
   */
  result() {
    return this._promise;
  }

  /**
   * cancel asks the server to stop this request. It resolves true when the
   * request was still in flight; the call then fails with Cancelled.
   * @returns {Promise<boolean>}
   */
  cancel() {
    return this._client.cancel(this);
  }

  /**
   * progress yields the progress notifications as they arrive, ends once the
   * final answer has come, and throws the call's error if it failed.
   * @returns {AsyncGenerator<Progress, void, undefined>}
   */
  async *progress() {
    if (!this._keep) throw new Error('gusset: this call keeps no progress; start it with keepProgress: true');
    for (;;) {
      if (this._queue.length === 0) {
        await new Promise((resolve) => { this._wake = () => resolve(undefined); });
        continue;
      }
      const item = /** @type {Progress|typeof END} */ (this._queue.shift());
      if (item === END) {
        this._queue.push(END); // a second iteration ends at once too
        break;
      }
      yield item;
    }
    if (this._error) throw this._error;
  }

  /** @returns {AsyncGenerator<any, void, undefined>} */
  [Symbol.asyncIterator]() {
    return this.progress();
  }

  /** @param {Progress} item */
  _progress(item) {
    if (this._onProgress) {
      try {
        this._onProgress(item);
      } catch (err) {
        this._client._warn(`gusset: the onProgress callback of request ${this.id} threw: ${err}`);
      }
    }
    if (this._keep) this._push(item);
  }

  /** @param {Progress|typeof END} item */
  _push(item) {
    this._queue.push(item);
    const wake = this._wake;
    this._wake = null;
    if (wake) wake();
  }

  /**
   * @param {unknown} result
   * @param {GussetError|null} error
   */
  _finish(result, error) {
    if (this._done) return;
    this._done = true;
    this._error = error;
    for (const cleanup of this._cleanups) cleanup();
    this._cleanups = [];
    if (error) this._reject(error);
    else this._resolve(result);
    this._push(END);
  }
}

/**
 * Sweep is a sweep-parameter request in flight. `for await` over it yields
 * each step (the partial of the progress notifications of stage "step") as
 * soon as the server has computed it; result() resolves with the final result.
 */
export class Sweep extends Call {
  /**
   * steps yields the sweep's steps as they stream.
   * @returns {AsyncGenerator<any, void, undefined>}
   */
  async *steps() {
    for await (const item of this.progress()) {
      if (item.stage === 'step' && item.partial !== undefined) yield item.partial;
    }
  }

  /** @returns {AsyncGenerator<any, void, undefined>} */
  [Symbol.asyncIterator]() {
    return this.steps();
  }
}

/** Process is one running server with the requests sent to it. */
class Process {
  /** @param {import('node:child_process').ChildProcessWithoutNullStreams} child */
  constructor(child) {
    this.child = child;
    /** @type {Map<number|string, Call>} */
    this.pending = new Map();
    /** Ids given up on (timeout, abort); their answers are dropped quietly. @type {Set<number|string>} */
    this.abandoned = new Set();
    this.dead = false;
    /** @type {string[]} */
    this.stderrTail = [];
    this.held = true;
    /** @type {Promise<void>} */
    this.closed = new Promise((resolve) => child.once('close', () => resolve()));
  }
}

/**
 * Client starts one gusset process and sends it requests.
 *
 *   const client = new Client();
 *   const result = await client.solve(model);
 *   for await (const step of client.sweep(model, { name: 'depth', from: 1, to: 4, count: 31 })) console.log(step);
 *   await client.close();
 *
 * The process starts at once and is kept; if it dies, the requests in flight
 * fail with ProcessDied and the next call starts a new one. Requests get
 * increasing integer ids and the answers are paired by id, whatever order the
 * server sends them in. While no request is in flight the process does not
 * keep Node's event loop alive, so a script that forgets close() still ends.
 *
 * Every method also takes its whole params object first, as it is written on
 * the wire: `client.solve({ model, cases: ['dead'] })` is
 * `client.solve(model, { cases: ['dead'] })`, and the options given second
 * add to it; optimiseLayout's first argument is always its params object.
 */
export class Client {
  /**
   * @param {ClientOptions} [options]
   * @throws {GussetNotFound} when no binary is found.
   */
  constructor(options = {}) {
    /** The binary's path. @readonly */
    this.binary = findBinary(options.binary ?? null);
    const argv = ['serve'];
    if (options.jobs != null) argv.push('--jobs', String(options.jobs));
    if (options.timeLimit != null) argv.push('--time-limit', String(options.timeLimit));
    argv.push(...(options.args ?? []).map(String));
    this._argv = argv;
    this._lineLimit = lineLimitOf(argv);
    /** The default timeout of each request in ms (undefined: none). */
    this.timeout = options.timeout;
    this._env = options.env;
    this._cwd = options.cwd;
    this._stderrLines = options.stderrLines ?? 50;
    this._onWarning = options.onWarning ?? ((message) => process.emitWarning(message, 'GussetWarning'));
    this._nextId = 1;
    this._closed = false;
    /** @type {Process} */
    this._proc = this._spawn();
  }

  /** pid is the process id of the running server, null when there is none. */
  get pid() {
    const proc = this._proc;
    return proc.dead || proc.child.exitCode !== null || proc.child.signalCode !== null ? null : proc.child.pid ?? null;
  }

  /** @returns {Process} */
  _spawn() {
    const child = spawn(this.binary, this._argv, { stdio: ['pipe', 'pipe', 'pipe'], env: this._env, cwd: this._cwd });
    const proc = new Process(child);
    /** @type {Buffer[]} */
    let parts = [];
    child.stdout.on('data', (/** @type {Buffer} */ chunk) => {
      let start = 0;
      for (let nl = chunk.indexOf(10); nl !== -1; nl = chunk.indexOf(10, start)) {
        const piece = chunk.subarray(start, nl);
        const line = parts.length === 0 ? piece : Buffer.concat([...parts, piece]);
        parts = [];
        start = nl + 1;
        this._dispatch(proc, line);
      }
      if (start < chunk.length) parts.push(chunk.subarray(start));
    });
    let stderrRest = '';
    child.stderr.setEncoding('utf8');
    child.stderr.on('data', (/** @type {string} */ text) => {
      const lines = (stderrRest + text).split('\n');
      stderrRest = /** @type {string} */ (lines.pop());
      for (const line of lines) this._stderr(proc, line.replace(/\r$/, ''));
    });
    child.stderr.on('end', () => {
      if (stderrRest) this._stderr(proc, stderrRest);
      stderrRest = '';
    });
    // A write to a process that has gone fails with EPIPE; the close event
    // that follows reports the requests in flight.
    child.stdin.on('error', () => {});
    /** @type {Error|null} */
    let spawnError = null;
    child.on('error', (err) => { spawnError = err; });
    child.on('close', (code, signal) => this._ended(proc, code, signal, spawnError));
    this._hold(proc, false);
    return proc;
  }

  /**
   * _hold keeps Node's event loop alive while requests are in flight, and lets
   * it end while none are.
   * @param {Process} proc
   * @param {boolean} on
   */
  _hold(proc, on) {
    if (proc.held === on) return;
    proc.held = on;
    const { child } = proc;
    for (const handle of [child, child.stdin, child.stdout, child.stderr]) {
      const h = /** @type {{ref?: () => void, unref?: () => void}} */ (/** @type {unknown} */ (handle));
      if (on) h.ref?.();
      else h.unref?.();
    }
  }

  /** @returns {Process} */
  _current() {
    if (this._closed) throw new ClientClosed('The gusset client is closed; make a new Client.');
    const proc = this._proc;
    if (proc.dead || proc.child.exitCode !== null || proc.child.signalCode !== null) {
      this._proc = this._spawn();
    }
    return this._proc;
  }

  /**
   * start sends a request and returns at once with its Call.
   * @param {string} method The method name ("solve", "sweep-parameter", ...).
   * @param {object} [params] The method's params (a JSON object).
   * @param {RequestOptions} [options]
   * @param {typeof Call} [type] Call or a subclass (Sweep) to return.
   * @returns {Call}
   * @throws {ClientClosed|LimitExceeded|TypeError} synchronously: the client is
   *   closed, the request is longer than the server's line limit, or params
   *   cannot be encoded.
   */
  start(method, params = undefined, options = {}, type = Call) {
    const proc = this._current();
    const id = this._nextId++;
    const call = new type(this, id, method, options.keepProgress ?? true, options.onProgress);
    /** @type {Record<string, unknown>} */
    const message = { jsonrpc: '2.0', id, method };
    if (params !== undefined) message.params = params;
    const line = JSON.stringify(message) + '\n';
    if (line.length > CHECK_LINE_BYTES / 4 && method !== 'describe') {
      this._checkSize(Buffer.byteLength(line) - 1, method, id);
    }
    const signal = options.signal;
    if (signal?.aborted) {
      call._finish(undefined, new Cancelled('The request was cancelled by its AbortSignal before it was sent.', { requestId: id, method, cause: signal.reason }));
      return call;
    }
    proc.pending.set(id, call);
    call._process = proc;
    this._hold(proc, true);
    call._cleanups.push(() => {
      if (proc.pending.size === 0 && !proc.dead) this._hold(proc, false);
    });
    const timeout = options.timeout ?? this.timeout;
    if (timeout != null) {
      const timer = setTimeout(() => this._giveUp(call, new RequestTimeout(
        `No answer to ${method} (request ${id}) within ${timeout} ms; the request was cancelled.`, { requestId: id, method })), timeout);
      call._cleanups.push(() => clearTimeout(timer));
    }
    if (signal) {
      const onAbort = () => this._giveUp(call, new Cancelled(
        `The request ${method} (request ${id}) was cancelled by its AbortSignal.`, { requestId: id, method, cause: signal.reason }));
      signal.addEventListener('abort', onAbort, { once: true });
      call._cleanups.push(() => signal.removeEventListener('abort', onAbort));
    }
    proc.child.stdin.write(line);
    return call;
  }

  /**
   * call sends a request and resolves with its result.
   * @param {string} method
   * @param {object} [params]
   * @param {RequestOptions} [options]
   * @returns {Promise<any>} rejects with a GussetError subclass.
   */
  async call(method, params = undefined, options = {}) {
    return this.start(method, params, { keepProgress: false, ...options }).result();
  }

  /**
   * cancel asks the server to stop a request in flight. It resolves true when
   * the request was in flight (it then fails with Cancelled), false when it
   * had already been answered.
   * @param {Call|number|string} target A Call or a request id.
   * @returns {Promise<boolean>}
   */
  async cancel(target) {
    if (target instanceof Call && target.done) return false;
    const id = target instanceof Call ? target.id : target;
    const result = await this.call('cancel', { request: id });
    return Boolean(result?.cancelled);
  }

  /**
   * close ends the process: the server answers the requests in flight and
   * exits; after `timeout` ms it is killed. Later calls throw ClientClosed.
   * @param {{timeout?: number}} [options]
   * @returns {Promise<void>}
   */
  async close({ timeout = 5000 } = {}) {
    if (this._closed) return;
    this._closed = true;
    const proc = this._proc;
    if (proc.dead) return;
    this._hold(proc, true);
    proc.child.stdin.end();
    /** @type {ReturnType<typeof setTimeout>|undefined} */
    let timer;
    const killed = new Promise((resolve) => {
      timer = setTimeout(() => {
        this._warn(`gusset: process ${proc.child.pid} did not stop within ${timeout} ms; killing it`);
        proc.child.kill('SIGKILL');
        resolve(undefined);
      }, timeout);
    });
    await Promise.race([proc.closed, killed]);
    clearTimeout(timer);
    await proc.closed;
  }

  /** @returns {Promise<void>} */
  [Symbol.asyncDispose]() {
    return this.close();
  }

  /**
   * _checkSize refuses a request the server would reject with an error it
   * could not pair with the request (an oversize line gets id null).
   * @param {number} size @param {string} method @param {number} id
   */
  _checkSize(size, method, id) {
    const limit = this._lineLimit;
    if (size > limit) {
      throw new LimitExceeded(
        `The ${method} request is ${size} bytes long, more than the server's line limit of ${limit} bytes. ` +
        `Start the client with args: ['--max-line-bytes', '${size}'] or send a smaller model.`,
        { detail: { limit, value: size }, requestId: id, method });
    }
  }

  /**
   * _giveUp fails a call that timed out or was aborted and cancels it on the server.
   * @param {Call} call @param {GussetError} error
   */
  _giveUp(call, error) {
    const proc = call._process;
    if (!proc || proc.pending.get(call.id) !== call) return;
    proc.pending.delete(call.id);
    proc.abandoned.add(call.id);
    if (!proc.dead && !proc.child.stdin.writableEnded) {
      const id = this._nextId++;
      const cancel = new Call(this, id, 'cancel', false, undefined);
      cancel._process = proc;
      proc.pending.set(id, cancel);
      proc.abandoned.add(id);
      cancel._cleanups.push(() => {
        if (proc.pending.size === 0 && !proc.dead) this._hold(proc, false);
      });
      proc.child.stdin.write(JSON.stringify({ jsonrpc: '2.0', id, method: 'cancel', params: { request: call.id } }) + '\n');
    }
    call._finish(undefined, error);
  }

  /** @param {string} message */
  _warn(message) {
    try {
      this._onWarning(message);
    } catch {
      // A host's warning handler must not break the reader.
    }
  }

  /** @param {Process} proc @param {string} line */
  _stderr(proc, line) {
    proc.stderrTail.push(line);
    if (proc.stderrTail.length > this._stderrLines) proc.stderrTail.shift();
  }

  /** @param {Process} proc @param {Buffer} raw */
  _dispatch(proc, raw) {
    const text = raw.toString('utf8').trim();
    if (!text) return;
    /** @type {any} */
    let message;
    try {
      message = JSON.parse(text);
    } catch {
      this._garbled(proc, text, 'not JSON');
      return;
    }
    if (message === null || typeof message !== 'object' || Array.isArray(message) || message.jsonrpc !== '2.0') {
      this._garbled(proc, text, 'not a JSON-RPC 2.0 message');
      return;
    }
    if ('id' in message && ('result' in message || 'error' in message)) {
      const id = message.id;
      const call = proc.pending.get(id);
      if (!call) {
        if (id === null) this._warn(`gusset: the server could not read a request: ${message.error?.message}`);
        else if (!proc.abandoned.delete(id)) this._warn(`gusset: an answer came for request ${JSON.stringify(id)}, which was not sent`);
        return;
      }
      proc.pending.delete(id);
      proc.abandoned.delete(id);
      if ('error' in message) call._finish(undefined, fromWire(message.error, id, call.method));
      else call._finish(message.result, null);
      return;
    }
    if (message.method === 'progress' && message.params !== null && typeof message.params === 'object') {
      const p = message.params;
      const call = proc.pending.get(p.request);
      if (call) call._progress({ request: p.request, stage: String(p.stage ?? ''), done: p.done ?? 0, total: p.total ?? 0, partial: p.partial });
      return;
    }
    this._garbled(proc, text, 'neither a response nor a progress notification');
  }

  /**
   * _garbled reports a line that is not a protocol message. It may have been
   * an answer, so the requests in flight fail with ProtocolError rather than
   * waiting for ever.
   * @param {Process} proc @param {string} text @param {string} why
   */
  _garbled(proc, text, why) {
    const shown = text.length <= 200 ? text : `${text.slice(0, 200)}...`;
    this._warn(`gusset: process ${proc.child.pid} wrote a line that is ${why}: ${JSON.stringify(shown)}`);
    const victims = [...proc.pending.values()];
    proc.pending.clear();
    for (const call of victims) {
      proc.abandoned.add(call.id);
      call._finish(undefined, new ProtocolError(
        `The gusset process wrote a line that is ${why} while ${call.method} (request ${call.id}) was in flight, ` +
        `so its answer may be lost: ${JSON.stringify(shown)}. Something other than the server is writing to its ` +
        'standard output, or the binary is not gusset.', { line: text, requestId: call.id, method: call.method }));
    }
  }

  /**
   * _ended fails the requests still in flight when the process has ended.
   * @param {Process} proc @param {number|null} code @param {string|null} signal @param {Error|null} spawnError
   */
  _ended(proc, code, signal, spawnError) {
    proc.dead = true;
    this._hold(proc, false);
    const victims = [...proc.pending.values()];
    proc.pending.clear();
    const tail = proc.stderrTail.join('\n');
    for (const call of victims) {
      let error;
      if (spawnError) {
        error = new GussetNotFound(`The gusset binary ${JSON.stringify(this.binary)} could not be started: ${spawnError.message}.\n` +
          'Build it from the root of the Gusset repository with:\n    go build -o gusset ./cmd/gusset', [this.binary], spawnError);
      } else {
        const how = signal ? `was killed by ${signal}` : `exited with status ${code}`;
        let text = `The gusset process (pid ${proc.child.pid}) ${how} while ${call.method} (request ${call.id}) was in flight. ` +
          'The next call starts a new process.';
        if (tail) text += `\nIts last standard-error lines:\n${tail}`;
        error = new ProcessDied(text, { exitCode: code, signal, stderr: tail, requestId: call.id, method: call.method });
      }
      call._finish(undefined, error);
    }
  }

  /**
   * @param {Record<string, any>} options
   * @returns {[Record<string, any>, RequestOptions]} the params and the request options.
   */
  static _split(options) {
    /** @type {Record<string, any>} */
    const params = {};
    /** @type {Record<string, any>} */
    const request = {};
    for (const [key, value] of Object.entries(options)) {
      if (value === undefined) continue;
      if (REQUEST_OPTIONS.has(key)) request[key] = value;
      else params[key] = value;
    }
    return [params, request];
  }

  /**
   * _isWhole reports whether a method's first argument is its whole params
   * object, as on the wire (it has a "model" key), rather than the model.
   * @param {any} first
   * @returns {boolean}
   */
  static _isWhole(first) {
    return first !== null && typeof first === 'object' && !Array.isArray(first) && 'model' in first;
  }

  /**
   * _whole builds a model method's params: the whole params object given
   * first, or {model}, with the other params added.
   * @param {any} first
   * @param {Record<string, any>} params
   * @returns {Record<string, any>}
   */
  static _whole(first, params) {
    return Client._isWhole(first) ? { ...first, ...params } : { model: first, ...params };
  }

  /**
   * _shift reads sweep(params, options): with the whole params first, the
   * second argument is the options.
   * @param {any} first
   * @param {any} parameters
   * @param {Record<string, any>} options
   * @returns {[any, Record<string, any>]}
   */
  static _shift(first, parameters, options) {
    if (Client._isWhole(first) && parameters !== undefined && !Array.isArray(parameters) && !('name' in parameters)) {
      return [undefined, { ...parameters, ...options }];
    }
    return [parameters, options];
  }

  /**
   * _axes wraps one axis in a list; nothing when none is given (the whole
   * params then hold them).
   * @param {any} parameters
   * @returns {Record<string, any>}
   */
  static _axes(parameters) {
    if (parameters === undefined) return {};
    return { parameters: Array.isArray(parameters) ? parameters : [parameters] };
  }

  /**
   * describe resolves with the server's name, versions, methods, limits and schema id.
   * @param {RequestOptions} [options]
   * @returns {Promise<any>}
   */
  async describe(options = {}) {
    const info = await this.call('describe', undefined, options);
    const limit = info?.limits?.max_line_bytes;
    if (Number.isInteger(limit)) this._lineLimit = limit;
    return info;
  }

  /**
   * methods resolves with the names of the methods the server offers.
   * @returns {Promise<string[]>}
   */
  async methods() {
    const info = await this.describe();
    return info.methods.map((/** @type {{name: string}} */ m) => m.name);
  }

  /**
   * solve runs a linear-elastic stiffness analysis. The result holds, per
   * case, displacements, axial forces (tension positive), reactions,
   * stresses and utilisation aligned with the model's arrays, and the
   * stability report.
   * @param {object} model
   * @param {{cases?: string[]} & RequestOptions & Record<string, any>} [options]
   *   params by their wire names, and the request options.
   * @returns {Promise<any>}
   */
  solve(model, options = {}) {
    const [params, request] = Client._split(options);
    return this.call('solve', Client._whole(model, params), request);
  }

  /**
   * reciprocate builds the reciprocal force diagram of a planar model; with
   * `edit` it returns the form that fits an edited force diagram.
   * @param {object} model
   * @param {{case?: string, forces?: number[], self_stress?: number, perpendicular?: boolean,
   *   picture?: boolean, edit?: object} & RequestOptions & Record<string, any>} [options]
   * @returns {Promise<any>}
   */
  reciprocate(model, options = {}) {
    const [params, request] = Client._split(options);
    return this.call('reciprocate', Client._whole(model, params), request);
  }

  /**
   * loadPath computes Maxwell's load path and, with `sizing`, volume, mass and carbon.
   * @param {object} model
   * @param {{cases?: string[], forces?: number[], sizing?: object, floor_area?: number}
   *   & RequestOptions & Record<string, any>} [options]
   * @returns {Promise<any>}
   */
  loadPath(model, options = {}) {
    const [params, request] = Client._split(options);
    return this.call('load-path', Client._whole(model, params), request);
  }

  /**
   * sweep starts a sweep-parameter request: `for await` over the returned
   * Sweep yields the steps as they stream, and its result() the final result.
   * @param {object} model
   * @param {object|object[]} parameters One axis ({name, from, to, count} or
   *   {name, values}) or a list of one or two.
   * @param {{metrics?: string[], cases?: string[], sizing?: object, objective?: object, shard?: object,
   *   steps?: string} & RequestOptions & Record<string, any>} [options]
   * @returns {Sweep}
   */
  sweep(model, parameters, options = {}) {
    [parameters, options] = Client._shift(model, parameters, options);
    const [params, request] = Client._split(options);
    return /** @type {Sweep} */ (this.start('sweep-parameter', Client._whole(model, { ...Client._axes(parameters), ...params }), request, Sweep));
  }

  /**
   * sweepParameter runs a sweep and resolves with its final result; `onStep`
   * is called with each step as it streams.
   * @param {object} model
   * @param {object|object[]} parameters
   * @param {{onStep?: (step: any) => void} & RequestOptions & Record<string, any>} [options]
   * @returns {Promise<any>}
   */
  sweepParameter(model, parameters, options = {}) {
    [parameters, options] = Client._shift(model, parameters, options);
    const { onStep, ...rest } = options;
    const [params, request] = Client._split(rest);
    const onProgress = request.onProgress;
    /** @param {Progress} p */
    request.onProgress = (p) => {
      onProgress?.(p);
      if (onStep && p.stage === 'step' && p.partial !== undefined) onStep(p.partial);
    };
    return this.call('sweep-parameter', Client._whole(model, { ...Client._axes(parameters), ...params }), request);
  }

  /**
   * optimiseLayout finds the least-volume pin-jointed layout over a ground
   * structure: supports, cases, tension_limit and compression_limit are
   * needed; domain and divisions, or nodes, set the candidates; dimension 3
   * makes a space layout (points, divisions and forces with three entries).
   * `onRound` is called with each member-adding round as it ends.
   * @param {{supports: object[], cases: object[], tension_limit: number, compression_limit: number,
   *   onRound?: (round: any) => void} & RequestOptions & Record<string, any>} options
   * @returns {Promise<any>}
   */
  optimiseLayout(options, more = {}) {
    const { onRound, ...rest } = { ...options, ...more };
    const [params, request] = Client._split(rest);
    const onProgress = request.onProgress;
    /** @param {Progress} p */
    request.onProgress = (p) => {
      onProgress?.(p);
      if (onRound && p.stage === 'member adding' && p.partial !== undefined) onRound(p.partial);
    };
    return this.call('optimise-layout', params, request);
  }

  /**
   * modes finds linear buckling load factors (kind "buckling": the factors
   * λ of load case `case` at which (K + λ·K_G)·φ = 0, negative ones
   * meaning the loads reversed) or natural frequencies (kind "vibration":
   * Hz, with participation factors and effective masses; mass from the
   * materials' mass_density and the nodes' mass), with mode shapes: the
   * `count` modes nearest `shift`. Linear results of the perfect
   * structure: imperfections, nonlinearity and the design codes govern
   * real design.
   * @param {object} model
   * @param {'buckling'|'vibration'} kind
   * @param {{case?: string, count?: number, shift?: number, picture?: boolean}
   *   & RequestOptions & Record<string, any>} [options]
   * @returns {Promise<any>}
   */
  modes(model, kind, options = {}) {
    if (Client._isWhole(model) && typeof kind === 'object' && kind !== null) [kind, options] = [undefined, kind];
    const [params, request] = Client._split(options);
    return this.call('modes', Client._whole(model, { ...(kind === undefined ? {} : { kind }), ...params }), request);
  }

  /**
   * findForm finds the equilibrium form of a network by the force density
   * method: give force_density (one q = N/L for every member, tension
   * positive) or force_densities (one per member); through ({node, at})
   * scales them so that the node passes through the point; targets lists
   * {member, length} or {member, force}. The result's model is the found
   * form, ready for solve and load-path (its load case model_case).
   * `onIteration` is called with each iteration's {iteration, change,
   * misfit} as it streams.
   * @param {object} model
   * @param {{onIteration?: (it: any) => void} & RequestOptions & Record<string, any>} [options]
   * @returns {Promise<any>}
   */
  findForm(model, options = {}) {
    const { onIteration, ...rest } = options;
    const [params, request] = Client._split(rest);
    const onProgress = request.onProgress;
    /** @param {Progress} p */
    request.onProgress = (p) => {
      onProgress?.(p);
      if (onIteration && p.stage === 'iterating' && p.partial !== undefined) onIteration(p.partial);
    };
    return this.call('find-form', Client._whole(model, params), request);
  }
}
