// Helpers that read a solve result's results along members by member id.
//
// A solve result holds, per case, `members`: one entry per model member,
// aligned with model.members (null for a bar), each beam's with its `id`, the internal forces and
// displacements at its stations and the exact extremes along it (see the
// schema's MemberResult). These helpers find them by id so that a host need
// not keep the member order.

/**
 * memberResult returns one case's results along the member called memberId.
 * @param {object} caseResult one entry of a solve result's `cases`
 * @param {string} memberId
 * @returns {object}
 * @throws {RangeError} when the case has no member of that id
 */
export function memberResult(caseResult, memberId) {
  for (const entry of caseResult.members ?? []) {
    if (entry && entry.id === memberId) return entry;
  }
  throw new RangeError(`no beam ${JSON.stringify(memberId)} in case ${JSON.stringify(caseResult.id)} (bars have no results along them)`);
}

/**
 * memberResults yields [case id, results along the member] for every case of a solve result.
 * @param {object} result a solve result
 * @param {string} memberId
 */
export function* memberResults(result, memberId) {
  for (const c of result.cases ?? []) yield [c.id, memberResult(c, memberId)];
}

/**
 * momentDiagram returns [[distance from the first end, moment]] at the member's stations;
 * axis is 'z' (the in-plane moment of a 2D frame) or 'y' (3D). It is empty when the solve
 * asked for no stations or the member is a bar.
 * @param {object} caseResult
 * @param {string} memberId
 * @param {'y'|'z'} [axis]
 * @returns {Array<[number, number]>}
 */
export function momentDiagram(caseResult, memberId, axis = 'z') {
  const entry = memberResult(caseResult, memberId);
  const moments = entry[`moment_${axis}`];
  if (!moments || moments.length === 0) return [];
  return moments.map((m, k) => [entry.stations[k], m]);
}

/**
 * memberCheck returns the checks of the member called memberId in one case:
 * `checked` (every check the member needs was made), `utilisation` (the
 * largest of them, null unless checked) and `axial_utilisation`, the axial
 * check alone, null where it was not made. For a member not fully checked (a
 * bar carrying loads across it, a beam without a section modulus) the axial
 * part is a part of the check, never the whole: the result's `unchecked` says
 * what is missing.
 * @param {object} caseResult one entry of a solve result's `cases`
 * @param {object} model the model it solved (its `members` give the order)
 * @param {string} memberId
 * @returns {{checked: boolean, utilisation: ?number, axial_utilisation: ?number}}
 * @throws {RangeError} when the model has no member of that id
 */
export function memberCheck(caseResult, model, memberId) {
  const index = (model.members ?? []).findIndex((m) => m.id === memberId);
  if (index < 0) throw new RangeError(`no member ${JSON.stringify(memberId)} in the model`);
  const utilisation = caseResult.utilisation[index];
  const entry = caseResult.members?.[index] ?? null;
  let axial;
  if (caseResult.axial_utilisation) axial = caseResult.axial_utilisation[index];
  else if (entry) axial = entry.axial_utilisation ?? null;
  else axial = utilisation; // a bar checked whole: its only check is axial
  return { checked: utilisation !== null, utilisation, axial_utilisation: axial };
}
