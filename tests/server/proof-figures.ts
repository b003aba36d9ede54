import { mkdirSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import path from 'node:path';

/** Where the proof tests leave their figures for `npm run verify:fuzz` (and the README) to print. */
export const FIGURES_FILE = path.resolve(process.env.PROOF_FIGURES ?? '.tmp/proof/figures.json');

/** Merges one section of figures into the shared file. */
export function recordFigure(section: string, figures: Record<string, unknown>): void {
  mkdirSync(path.dirname(FIGURES_FILE), { recursive: true });
  const all = existsSync(FIGURES_FILE) ? (JSON.parse(readFileSync(FIGURES_FILE, 'utf8')) as Record<string, unknown>) : {};
  all[section] = figures;
  writeFileSync(FIGURES_FILE, `${JSON.stringify(all, null, 2)}\n`);
}
