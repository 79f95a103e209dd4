// Helpers for pattern loading and the envelope of a solve result.
//
// onOffPattern builds a model's `patterns` entry: the permanent cases with
// their factors in every generated combination and each variable case on
// (factor_on) or off (factor_off); the server generates the combinations
// "<id>/on:<case>+<case>…" and "<id>/all-off". A solve with
// `envelope: { cases: [...], omit_cases: false }` (a pattern's id stands for
// all its combinations; default every reported case) adds `envelope`: per
// node, support and member the largest and smallest value of each result
// with the governing case (see the schema's Envelope). A member's enveloped
// utilisation is null when some enveloped case could not check it; it never
// leaves that case out.

/**
 * onOffPattern returns a `patterns` entry switching the variable cases on
 * and off: mode "all" generates every on/off pattern (2ⁿ combinations, at
 * most 10 variable cases), "each" each variable case on alone.
 * @param {string} id the pattern's id
 * @param {string[]} variable the load-case ids switched on and off
 * @param {{permanent?: Object<string, number>, factorOn?: number, factorOff?: number, mode?: string}} [options]
 * @returns {object}
 */
export function onOffPattern(id, variable, { permanent, factorOn = 1, factorOff = 0, mode = 'all' } = {}) {
  const entry = { id, variable: variable.map((c) => ({ case: c, factor_on: factorOn, factor_off: factorOff })), mode };
  if (permanent && Object.keys(permanent).length > 0) entry.permanent = { ...permanent };
  return entry;
}

/**
 * memberEnvelope returns the envelope of the member called id; it throws
 * when the result has no envelope or no such member.
 * @param {object} result a solve result
 * @param {string} id the member's id
 * @returns {object}
 */
export function memberEnvelope(result, id) {
  if (!result.envelope) throw new Error('the result has no envelope: ask solve for one with envelope: {}');
  const entry = result.envelope.members.find((m) => m.id === id);
  if (!entry) throw new Error(`no member ${JSON.stringify(id)} in the envelope`);
  return entry;
}

/**
 * governing returns {value, case, at} of one bound of a member's envelope:
 * quantity "axial", "shear_y", "moment_z", "shear_z", "torsion", "moment_y"
 * or "utilisation"; bound "max" or "min". It throws for a utilisation the
 * envelope could not give (a case left it unchecked), with the reason.
 * @param {object} result a solve result
 * @param {string} id the member's id
 * @param {string} [quantity]
 * @param {string} [bound]
 * @returns {{value: number, case: string, at: number|undefined}}
 */
export function governing(result, id, quantity = 'moment_z', bound = 'max') {
  const entry = memberEnvelope(result, id);
  const ranges = entry[quantity];
  if (ranges == null) {
    throw new Error(`member ${JSON.stringify(id)} has no enveloped ${quantity}: ${entry.utilisation_note ?? 'a bar has no internal forces along it'}`);
  }
  const { value, case: governingCase, at } = ranges[bound];
  return { value, case: governingCase, at };
}
