import type { Express } from 'express';

/** One API route as Express holds it: `POST /api/diagnoses/:id/steps`. */
export interface RouteEntry { method: string; path: string; key: string }

interface LayerLike {
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: LayerLike[] };
}

const join = (base: string, part: unknown): string => {
  if (typeof part !== 'string') throw new Error(`a route is mounted on a non-string path (${String(part)}): give it a plain path so the route table can name it`);
  const p = part === '/' ? '' : part;
  return `${base}${p}` || '/';
};

function walk(stack: LayerLike[], base: string, out: RouteEntry[]): void {
  for (const layer of stack) {
    if (layer.route) {
      const path = join(base, layer.route.path);
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== '_all') out.push({ method: method.toUpperCase(), path, key: `${method.toUpperCase()} ${path}` });
      }
    } else if (layer.handle?.stack) {
      walk(layer.handle.stack, join(base, layer.rawPath ?? '/'), out);
    }
  }
}

/**
 * Every route of the app, read from Express's own router stack (nested routers included), so that
 * a route added anywhere shows up here without anyone keeping a list.
 */
export function routeTable(app: Express): RouteEntry[] {
  const router = (app as unknown as { router: { stack: LayerLike[] } }).router;
  const out: RouteEntry[] = [];
  walk(router.stack, '', out);
  return out.filter((r) => r.path.startsWith('/api/'));
}
