/** The discretization engine: plain modules, no HTTP or database (DESIGN.md "The computation"). */
export { discretizeZpk, bilinearZpk, backwardEulerZpk, matchedZpk, zohDiscretize } from './methods';
export type { DiscretizeOptions, DiscreteResult } from './methods';
export { runDiscretize } from './run';
export { DspInputError } from './errors';
export type { DspIssue } from './errors';
export { inputToZpk, zpkToTfDescending, zpkToDiscreteTf, evalZpk } from './lti';
export { polyFromRoots, polyRoots, polyval, polyMul } from './poly';
export { zToS, discreteStability, continuousDcGain, discreteDcGain } from './analysis';
export * from './types';
