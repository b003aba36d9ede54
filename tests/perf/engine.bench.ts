/**
 * Engine benchmark: soundness check and path figures on generated procedures of 200, 2 000 and
 * 20 000 steps. Run with `npx tsx tests/perf/engine.bench.ts`. Prints the median of each and the
 * 20 000 / 2 000 ratio; exits non-zero when 2 000 steps take 20 ms or more, or the ratio is 12 or more.
 */
import { loadavg } from 'node:os';
import { lintProcedure, pathFigures } from '../../shared/engine';
import type { ProcedureDocument } from '../../shared/schema';
import { soundProcedure } from '../shared/generate';

const SIZES = [200, 2_000, 20_000] as const;

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

/** Median wall time and median process CPU time of `runs` calls, after warming up the JIT. */
function time(run: () => unknown, runs: number): { wall: number; cpu: number } {
  for (let i = 0; i < 15; i++) run();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    run();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  return { wall: median(wall), cpu: median(cpu) };
}

const results = new Map<number, { lint: number; figures: number; lintCpu: number; figuresCpu: number }>();
for (const n of SIZES) {
  const doc: ProcedureDocument = soundProcedure(n, 42);
  const errors = lintProcedure(doc).errorCount;
  if (errors > 0) throw new Error(`generated procedure of ${n} steps has ${errors} soundness errors`);
  const runs = n >= 20_000 ? 11 : 31;
  const lint = time(() => lintProcedure(doc), runs);
  const figures = time(() => pathFigures(doc), runs);
  results.set(n, { lint: lint.wall, figures: figures.wall, lintCpu: lint.cpu, figuresCpu: figures.cpu });
}

const fmt = (ms: number) => `${ms.toFixed(2).padStart(8)} ms`;
// Wall time is the figure that counts; CPU time and the load average show how busy the machine was.
console.log(`load average ${loadavg().map((l) => l.toFixed(1)).join(' ')}`);
console.log('steps     lintProcedure   pathFigures   (median wall)   lint cpu   figures cpu');
for (const [n, r] of results) console.log(`${String(n).padEnd(8)} ${fmt(r.lint)}   ${fmt(r.figures)}                ${fmt(r.lintCpu)} ${fmt(r.figuresCpu)}`);
const small = results.get(2_000)!;
const big = results.get(20_000)!;
const ratio = { lint: big.lint / small.lint, figures: big.figures / small.figures };
console.log(`ratio 20 000 / 2 000: lintProcedure ${ratio.lint.toFixed(1)}, pathFigures ${ratio.figures.toFixed(1)}`);
const failures = [
  ...(small.lint >= 20 ? [`lintProcedure on 2 000 steps took ${small.lint.toFixed(1)} ms (budget 20 ms)`] : []),
  ...(small.figures >= 20 ? [`pathFigures on 2 000 steps took ${small.figures.toFixed(1)} ms (budget 20 ms)`] : []),
  ...(ratio.lint >= 12 ? [`lintProcedure ratio ${ratio.lint.toFixed(1)} (budget 12)`] : []),
  ...(ratio.figures >= 12 ? [`pathFigures ratio ${ratio.figures.toFixed(1)} (budget 12)`] : []),
];
if (failures.length) {
  console.error(`Over budget:\n  ${failures.join('\n  ')}`);
  process.exitCode = 1;
} else console.log('Within budget: 2 000 steps under 20 ms, ratio under 12.');
