import type { ProcedureDocument } from '@shared/schema';
import { noSpark } from './no-spark';
import { weakSpark } from './weak-spark';
import { willNotStop } from './will-not-stop';

export interface DemoProcedure {
  /** Stable across releases: seeders and links use it. */
  readonly slug: 'no-spark' | 'weak-spark' | 'will-not-stop';
  readonly document: ProcedureDocument;
}

/** The demo procedures of the invented Larkspur Lane Powersports scenario. */
export const DEMO_PROCEDURES: readonly DemoProcedure[] = [
  { slug: 'no-spark', document: noSpark },
  { slug: 'weak-spark', document: weakSpark },
  { slug: 'will-not-stop', document: willNotStop },
];
