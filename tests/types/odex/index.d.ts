// Types for the parts of the `odex` ODE solver (2.0.4, a CommonJS package without declarations of
// its own; it ships TypeScript sources that do not compile under this project's strict settings) that
// the tests use: Hairer and Wanner's ODEX extrapolation integrator. tsconfig.test.json maps "odex" here.
export type Derivative = (x: number, y: number[]) => number[];
export type OutputFunction = (
  step: number,
  xOld: number,
  x: number,
  y: number[],
  dense?: (component: number, x: number) => number,
) => boolean | void;
export enum Outcome {
  Converged = 0,
  MaxStepsExceeded = 1,
  EarlyReturn = 2,
}
export interface Solution {
  y: number[];
  outcome: Outcome;
  nStep: number;
  xEnd: number;
  nAccept: number;
  nReject: number;
  nEval: number;
}
export class Solver {
  constructor(n: number);
  maxSteps: number;
  initialStepSize: number;
  maxStepSize: number;
  denseOutput: boolean;
  relativeTolerance: number | number[];
  absoluteTolerance: number | number[];
  solve(f: Derivative, x0: number, y0: number[], xEnd: number, out?: OutputFunction): Solution;
}
