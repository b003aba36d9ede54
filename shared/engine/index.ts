export { lintProcedure, type LintReport, type LintCode, type LintFinding, type LintOptions, type LintSeverity } from './lint';
export { walkProcedure, ProcedureWalk, type WalkAnswer, type WalkEntry, type WalkState, type WalkProblem, type WalkProblemCode, type PathStep, type EntryRecord } from './walk';
export { stepView, limitsView, type StepView, type LimitsView } from './step-view';
export { pathFigures, stepMinutes, type PathFigures, type PathFiguresOptions, type PathLength, type StepFigures, type BranchCounts } from './figures';
export { buildGraph, type ProcedureGraph } from './graph';
export { reach, canReachEnding, stronglyConnected, depthFirst, dominators, isBackEdge, type Components, type Dominators, type DepthFirst } from './algorithms';
export { stepsToGo, branchJump, type StepsToGo } from './progress';
