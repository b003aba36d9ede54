import { Router } from 'express';
import type { AppDeps } from '../deps';

/**
 * The balancer's check: 200 while this server reaches the primary. The replica's state is
 * reported beside it but never fails the check: without it Debrief reads the primary.
 */
export function healthRoutes(deps: AppDeps): Router {
  const r = Router();
  r.get('/', async (_req, res) => {
    const replica = deps.reads ? deps.reads.status() : { state: 'none', lagSeconds: null, debriefReadsFrom: 'primary' };
    try {
      await deps.sequelize.query('SELECT 1');
      res.json({ ok: true, db: 'up', replica });
    } catch {
      res.status(503).json({ ok: false, db: 'down', replica });
    }
  });
  return r;
}
