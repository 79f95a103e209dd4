// Helpers for inclined supports and area loads.
//
// A support with `directions` (one vector in 2D, one or two in 3D) has axes of
// its own: its `fix`, `springs` and `displacement` name components along them,
// and its reaction in a solve result carries `local_force` (and
// `local_moment`) beside the global `force`. An area load spreads a pressure
// (normal to a flat, convex panel of 3 or more nodes of a 3D model) or a force
// per area along a global direction to the panel's nodes, or to its edge
// members one way or two ways, with the panel's total conserved exactly.
// These helpers build the objects the model takes and read the local
// reactions back.

/**
 * inclinedSupport returns a support whose components act along its own axes.
 * `directions` is one vector (local x; in 2D local y follows a quarter turn
 * anticlockwise) or, in 3D, two (the second fixes local y). A roller on a 30°
 * incline in 2D is `inclinedSupport('B', ['y'], [[Math.sqrt(3), 1]])`.
 * @param {string} node
 * @param {string[]} fix
 * @param {number[][]} directions
 * @param {{springs?: object, displacement?: object}} [extra]
 * @returns {object}
 */
export function inclinedSupport(node, fix, directions, extra = {}) {
  if (!Array.isArray(directions) || directions.length < 1 || directions.length > 2) {
    throw new TypeError('directions takes one or two vectors');
  }
  const out = { node, fix: [...fix], directions: directions.map((d) => [...d]) };
  if (extra.springs) out.springs = { ...extra.springs };
  if (extra.displacement) out.displacement = { ...extra.displacement };
  return out;
}

/**
 * areaLoad returns an entry of a load case's `area_loads`. Give exactly one
 * of `pressure` (force per area normal to the panel; positive presses on the
 * face the right-hand-rule normal of the node order points out of) and
 * `value` (a global force per area vector; `projected: true` measures the
 * area on the plane normal to it, as snow per plan area). `to: 'members'`
 * with `span: 'one-way'` (and `span_direction`) or `'two-way'` spreads a
 * rectangular panel to its edge members.
 * @param {string[]} nodes
 * @param {{pressure?: number, value?: number[], projected?: boolean, to?: string, span?: string, span_direction?: number[]}} load
 * @returns {object}
 */
export function areaLoad(nodes, load) {
  const { pressure, value, projected, to, span, span_direction: spanDirection } = load ?? {};
  if ((pressure === undefined) === (value === undefined)) {
    throw new TypeError('give exactly one of pressure and value');
  }
  const out = { nodes: [...nodes] };
  if (pressure !== undefined) out.pressure = pressure;
  else out.value = [...value];
  if (projected) out.projected = true;
  if (to !== undefined) out.to = to;
  if (span !== undefined) out.span = span;
  if (spanDirection !== undefined) out.span_direction = [...spanDirection];
  return out;
}

/**
 * localReactions returns a Map from case id to a Map from node id to the
 * reaction along the support's own axes, for supports with directions
 * (supports in global axes are left out).
 * @param {object} result a solve result
 * @returns {Map<string, Map<string, number[]>>}
 */
export function localReactions(result) {
  const out = new Map();
  for (const c of result.cases ?? []) {
    const local = new Map();
    for (const r of c.reactions ?? []) {
      if (r.local_force) local.set(r.node, [...r.local_force]);
    }
    out.set(c.id, local);
  }
  return out;
}
