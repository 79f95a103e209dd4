// Helpers that read the iteration report of a solve result.
//
// A model with one-sided members (type "cable", or behaviour "tension-only"
// / "compression-only" on a bar), or a solve with second_order (P-Delta), is
// solved case by case by iteration; each such case of the result carries
// `iteration`: the solves made, the numeric factorisations, the ids of the
// members left slack, and for second order the amplification and an upper
// bound of the critical load factor. These helpers collect them by case id.

/**
 * slackMembers returns a Map from case id to the ids of the members left
 * slack. A case solved by superposition (no one-sided members, no second
 * order) has no iteration report and is left out.
 * @param {object} result a solve result
 * @returns {Map<string, string[]>}
 */
export function slackMembers(result) {
  const out = new Map();
  for (const c of result.cases ?? []) {
    if (c.iteration) out.set(c.id, [...(c.iteration.slack_members ?? [])]);
  }
  return out;
}

/**
 * amplification returns a Map from case id to the second-order
 * amplification (the largest nodal translation over that of the first-order
 * solve), or null where the report has none.
 * @param {object} result a solve result
 * @returns {Map<string, number|null>}
 */
export function amplification(result) {
  const out = new Map();
  for (const c of result.cases ?? []) {
    if (c.iteration) out.set(c.id, c.iteration.amplification ?? null);
  }
  return out;
}
