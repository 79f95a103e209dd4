// Typed errors of the Gusset client.
//
// Every failure the client reports is a GussetError. Errors that the server
// sends keep their wire code, kind, problems and detail, and each code has its
// own subclass, so a host can catch exactly what it can handle:
//
//   try {
//     await client.solve(model);
//   } catch (err) {
//     if (err instanceof InvalidModel) for (const p of err.problems) highlight(p.path, p.message);
//     else throw err;
//   }
//
// Errors raised by the client itself (the binary missing, the process dying,
// a garbled output line, a timeout) have code null.

/**
 * A located defect in a request.
 * @typedef {object} Problem
 * @property {string} path JSON pointer (RFC 6901) from the root of the request
 *   object, for example "/params/model/members/0/ends/1"; "" is the whole request.
 * @property {string} message What is wrong there.
 */

/**
 * @typedef {object} ErrorFields
 * @property {number|null} [code] The wire code; default the class's code.
 * @property {string} [kind] The short name of the error class; default the class's kind.
 * @property {Problem[]} [problems] The located defects.
 * @property {unknown} [detail] Structured data (a mechanism's motions, a limit and its value).
 * @property {number|string|null} [requestId] The id of the failed request.
 * @property {string|null} [method] The method of the failed request.
 * @property {unknown} [cause] The underlying error.
 */

/** GussetError is the base of every error the client raises. */
export class GussetError extends Error {
  /** The wire code a subclass stands for (null for client errors). @type {number|null} */
  static code = null;
  /** The default kind of a subclass. @type {string} */
  static kind = '';

  /**
   * @param {string} message A sentence a person can act on.
   * @param {ErrorFields} [fields]
   */
  constructor(message, fields = {}) {
    super(message, fields.cause === undefined ? undefined : { cause: fields.cause });
    const type = /** @type {typeof GussetError} */ (this.constructor);
    this.name = type.name;
    /** @type {number|null} */
    this.code = fields.code ?? type.code;
    /** @type {string} */
    this.kind = fields.kind ?? type.kind;
    /** @type {Problem[]} */
    this.problems = (fields.problems ?? []).map((p) => ({ path: p.path, message: p.message }));
    /** @type {unknown} */
    this.detail = fields.detail ?? null;
    /** @type {number|string|null} */
    this.requestId = fields.requestId ?? null;
    /** @type {string|null} */
    this.method = fields.method ?? null;
  }

  /** toString adds the code and the problems to the message. */
  toString() {
    let text = `${this.name}: ${this.message}`;
    if (this.code !== null) text += ` (code ${this.code})`;
    for (const p of this.problems) text += `\n  at ${p.path || '(the request)'}: ${p.message}`;
    return text;
  }
}

/** GussetNotFound means no gusset binary could be found or started. */
export class GussetNotFound extends GussetError {
  static kind = 'binary not found';

  /**
   * @param {string} message
   * @param {string[]} [searched] The places looked at, in order.
   * @param {unknown} [cause]
   */
  constructor(message, searched = [], cause = undefined) {
    super(message, { cause });
    /** @type {string[]} */
    this.searched = searched;
  }
}

/**
 * ProcessDied means the gusset process ended while the request was in flight.
 * The next call starts a new process.
 */
export class ProcessDied extends GussetError {
  static kind = 'process died';

  /**
   * @param {string} message
   * @param {{exitCode?: number|null, signal?: string|null, stderr?: string} & ErrorFields} [fields]
   */
  constructor(message, fields = {}) {
    super(message, fields);
    /** The exit status, null when killed by a signal. @type {number|null} */
    this.exitCode = fields.exitCode ?? null;
    /** The signal that killed the process ("SIGKILL"), or null. @type {string|null} */
    this.signal = fields.signal ?? null;
    /** The last lines the process wrote to its standard error. @type {string} */
    this.stderr = fields.stderr ?? '';
  }
}

/**
 * ProtocolError means the process wrote a line that is not a protocol message.
 * Such a line may have been an answer, so every request in flight fails with it.
 */
export class ProtocolError extends GussetError {
  static kind = 'protocol error';

  /**
   * @param {string} message
   * @param {{line?: string} & ErrorFields} [fields]
   */
  constructor(message, fields = {}) {
    super(message, fields);
    /** The offending line. @type {string} */
    this.line = fields.line ?? '';
  }
}

/** RequestTimeout means no answer came within the request's timeout; the request was cancelled. */
export class RequestTimeout extends GussetError {
  static kind = 'timeout';
}

/** ClientClosed means the client was closed before or during the call. */
export class ClientClosed extends GussetError {
  static kind = 'closed';
}

// BEGIN GENERATED: error classes (by go generate ./protocol from the error-code table; do not edit)

/** ParseError (-32700): the line is not JSON, or is longer than `--max-line-bytes` (id null; reading goes on). */
export class ParseError extends GussetError {
  static code = -32700;
  static kind = 'parse error';
}

/** InvalidRequest (-32600): not a JSON-RPC 2.0 request object; an id already in flight. */
export class InvalidRequest extends GussetError {
  static code = -32600;
  static kind = 'invalid request';
}

/** MethodNotFound (-32601): unknown method. */
export class MethodNotFound extends GussetError {
  static code = -32601;
  static kind = 'method not found';
}

/** InvalidParams (-32602): params do not follow the schema (wrong types, unknown fields, numbers out of double range). */
export class InvalidParams extends GussetError {
  static code = -32602;
  static kind = 'invalid params';
}

/** InternalError (-32603): a bug (a recovered panic); the process goes on. */
export class InternalError extends GussetError {
  static code = -32603;
  static kind = 'internal error';
}

/** Cancelled (-32000): stopped by `cancel`. */
export class Cancelled extends GussetError {
  static code = -32000;
  static kind = 'cancelled';
}

/** LimitExceeded (-32001): a model or sweep over the limits. */
export class LimitExceeded extends GussetError {
  static code = -32001;
  static kind = 'limit exceeded';
}

/** Overloaded (-32002): reserved for too many waiting requests. */
export class Overloaded extends GussetError {
  static code = -32002;
  static kind = 'overloaded';
}

/** ShuttingDown (-32003): the server is stopping. */
export class ShuttingDown extends GussetError {
  static code = -32003;
  static kind = 'shutting down';
}

/** TimeLimit (-32004): the request ran longer than `--time-limit`. */
export class TimeLimit extends GussetError {
  static code = -32004;
  static kind = 'time limit';
}

/** InvalidModel (1000): duplicate or dangling ids, zero-length members, coincident nodes, dimension mismatches, non-positive stiffness or area, an empty model, .... */
export class InvalidModel extends GussetError {
  static code = 1000;
  static kind = 'invalid model';
}

/** ExpressionError (1001): unknown parameter, syntax error, division by zero, non-finite value. */
export class ExpressionError extends GussetError {
  static code = 1001;
  static kind = 'expression error';
}

/** UnstableStructure (1002): a mechanism; `data.detail` carries its freedoms and node motions. */
export class UnstableStructure extends GussetError {
  static code = 1002;
  static kind = 'unstable structure';
}

/** NotPlanar (1003): members cross without a shared node. */
export class NotPlanar extends GussetError {
  static code = 1003;
  static kind = 'not planar';
}

/** NotInEquilibrium (1004): forces that do not balance, with the closure error. */
export class NotInEquilibrium extends GussetError {
  static code = 1004;
  static kind = 'not in equilibrium';
}

/** WrongDimension (1005): a 2D-only method given a 3D model. */
export class WrongDimension extends GussetError {
  static code = 1005;
  static kind = 'wrong dimension';
}

/** MissingData (1006): e.g. material limits needed for sizing. */
export class MissingData extends GussetError {
  static code = 1006;
  static kind = 'missing data';
}

/** Infeasible (1007): loads that cannot reach a support. */
export class Infeasible extends GussetError {
  static code = 1007;
  static kind = 'infeasible';
}

/** NoSolution (1008): an edited force diagram no form fits. */
export class NoSolution extends GussetError {
  static code = 1008;
  static kind = 'no solution';
}

/** UnknownCase (1009): a case or combination id that does not exist. */
export class UnknownCase extends GussetError {
  static code = 1009;
  static kind = 'unknown case';
}

/** wireErrors lists the classes of the wire codes, in code-table order. */
export const wireErrors = [
  ParseError,
  InvalidRequest,
  MethodNotFound,
  InvalidParams,
  InternalError,
  Cancelled,
  LimitExceeded,
  Overloaded,
  ShuttingDown,
  TimeLimit,
  InvalidModel,
  ExpressionError,
  UnstableStructure,
  NotPlanar,
  NotInEquilibrium,
  WrongDimension,
  MissingData,
  Infeasible,
  NoSolution,
  UnknownCase,
];
// END GENERATED: error classes

/** @type {Map<number, typeof GussetError>} */
const byCode = new Map(wireErrors.map((type) => [/** @type {number} */ (type.code), type]));

/**
 * errorClass returns the error class for a wire code, GussetError for unknown codes.
 * @param {number} code
 * @returns {typeof GussetError}
 */
export function errorClass(code) {
  return byCode.get(code) ?? GussetError;
}

/**
 * fromWire builds the typed error for a JSON-RPC error object. A malformed
 * object still gives a GussetError, since it comes from another process.
 * @param {unknown} error The "error" member of a response.
 * @param {number|string|null} [requestId]
 * @param {string|null} [method]
 * @returns {GussetError}
 */
export function fromWire(error, requestId = null, method = null) {
  if (error === null || typeof error !== 'object' || Array.isArray(error)) {
    return new ProtocolError(`The server sent an error that is not an object: ${JSON.stringify(error)}.`, { requestId, method });
  }
  const e = /** @type {Record<string, any>} */ (error);
  const code = Number.isInteger(e.code) ? e.code : null;
  const message = typeof e.message === 'string' && e.message ? e.message : 'The server reported an error without a message.';
  const data = e.data !== null && typeof e.data === 'object' ? e.data : {};
  /** @type {Problem[]} */
  const problems = [];
  if (Array.isArray(data.problems)) {
    for (const p of data.problems) {
      if (p !== null && typeof p === 'object') problems.push({ path: String(p.path ?? ''), message: String(p.message ?? '') });
    }
  }
  const type = code === null ? GussetError : errorClass(code);
  return new type(message, {
    code,
    kind: typeof data.kind === 'string' ? data.kind : undefined,
    problems,
    detail: data.detail,
    requestId,
    method,
  });
}
