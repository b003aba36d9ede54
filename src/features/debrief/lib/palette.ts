// Chart colours come from the design tokens of src/styles.css, read once at run time, so charts
// follow the theme; the fallbacks are the token values at the time of writing.
const FALLBACK = {
  ink: '#1d232c', inkSoft: '#46505e', paper: '#f5f2ea', line: '#d6d0c2',
  signal: '#a4470a', signalSoft: '#fbe7d3', go: '#17703a', stop: '#b3261e', edge: '#6b3fa0',
};
export type Palette = typeof FALLBACK;

let cached: Palette | null = null;

export function palette(): Palette {
  if (cached) return cached;
  if (typeof document === 'undefined') return FALLBACK;
  const css = getComputedStyle(document.documentElement);
  const read = (name: string, fallback: string) => css.getPropertyValue(`--color-${name}`).trim() || fallback;
  cached = {
    ink: read('ink', FALLBACK.ink), inkSoft: read('ink-soft', FALLBACK.inkSoft), paper: read('paper', FALLBACK.paper),
    line: read('line', FALLBACK.line), signal: read('signal', FALLBACK.signal), signalSoft: read('signal-soft', FALLBACK.signalSoft),
    go: read('go', FALLBACK.go), stop: read('stop', FALLBACK.stop), edge: read('edge', FALLBACK.edge),
  };
  return cached;
}

/** Five steps from the panel's line colour to a deep signal, for heat on edges. */
export function heatRamp(p: Palette): string[] {
  return [p.line, mix(p.line, p.signal, 0.35), mix(p.line, p.signal, 0.65), p.signal, mix(p.signal, p.ink, 0.45)];
}

function mix(a: string, b: string, t: number): string {
  const pa = hex(a);
  const pb = hex(b);
  if (!pa || !pb) return t < 0.5 ? a : b;
  return `#${pa.map((v, i) => Math.round(v + (pb[i]! - v) * t).toString(16).padStart(2, '0')).join('')}`;
}

function hex(c: string): number[] | null {
  const m = /^#([0-9a-f]{6})$/i.exec(c);
  return m ? [0, 2, 4].map((i) => parseInt(m[1]!.slice(i, i + 2), 16)) : null;
}
