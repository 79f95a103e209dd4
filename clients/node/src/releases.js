// A helper for end releases on beams.
//
// A beam's `releases` lists, per end, the rotations released there in the
// member's local axes: 'rx' (torsion), 'ry' and 'rz' (bending); a 2D beam has
// 'rz' only. A released end carries no moment about those axes, so two beams
// released at a shared node make a hinge. Bars take no releases (their ends
// carry no moment already).

const COMPONENTS = new Set(['rx', 'ry', 'rz']);

/**
 * released returns a copy of the beam `member` with the given releases:
 * `first` and `second` list the components released at the first and second
 * end. `released(beam, { second: ['rz'] })` hinges a plane beam's second end.
 * Throws TypeError for a component other than rx, ry, rz (the solver checks
 * the rest: beams only, rz only in 2D, no repeats).
 * @param {object} member
 * @param {{first?: string[], second?: string[]}} [ends]
 * @returns {object}
 */
export function released(member, { first = [], second = [] } = {}) {
  const out = { ...member };
  const releases = {};
  for (const [name, comps] of [['first', first], ['second', second]]) {
    for (const c of comps) {
      if (!COMPONENTS.has(c)) throw new TypeError(`release component ${JSON.stringify(c)}: use rx, ry or rz`);
    }
    if (comps.length > 0) releases[name] = [...comps];
  }
  if (Object.keys(releases).length > 0) out.releases = releases;
  else delete out.releases;
  return out;
}
