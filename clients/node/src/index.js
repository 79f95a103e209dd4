// gusset drives the Gusset structural solver from Node.js.
//
// Gusset is a solver process that a host starts once and drives with JSON
// lines: stiffness analysis, reciprocal force diagrams, Maxwell's load path and
// parameter sweeps. This module (no dependencies, Node 20 and later) starts
// the process, sends requests, pairs the answers, streams progress and sweep
// steps, and throws typed errors. Every result is for preliminary design: a
// qualified engineer checks the design against the local codes and standards.

export { Client, Call, Sweep } from './client.js';
export { memberCheck, memberResult, memberResults, momentDiagram } from './members.js';
export { released } from './releases.js';
export { areaLoad, inclinedSupport, localReactions } from './panels.js';
export { governing, memberEnvelope, onOffPattern } from './envelope.js';
export { amplification, slackMembers } from './iteration.js';
export { BUILD_HINT, defaultHints, findBinary } from './binary.js';
export * from './errors.js';
