// A search task as it crosses to a compute worker (structured clone); the worker answers with its SearchPartial.

import type { BranchPrefix, BranchStart, SearchSettings, SubsetProblem } from '../../core/search/index.ts';

export type SearchTask =
  | { kind: 'exhaustive'; id: number; problem: SubsetProblem; settings: SearchSettings; from: number; to: number }
  | {
      kind: 'branchAndBound';
      id: number;
      problem: SubsetProblem;
      settings: SearchSettings;
      prefix: BranchPrefix;
      /** The stepwise start's threshold and counted subsets, and the root's eigenvalue floor (planBranchAndBound). */
      start: BranchStart;
      /** Int32 node counter shared by every task of one search, for the node budget. */
      nodeCounter: SharedArrayBuffer;
      maxNodes: number;
    };

