import { Router } from 'express';
import type { AppDeps } from '../deps';
import { ctxOf } from '../auth/context';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import { notFound } from '../lib/errors';
import { ProcedureListQuery } from '@shared/schema/bench';
import * as bench from '../services/bench.service';

/** What a phone needs to walk a procedure offline: the published list and the pinned documents. */
export function benchRoutes(deps: AppDeps): Router {
  const r = Router();
  r.get('/procedures', async (req, res) => {
    res.json(await bench.listPublished(deps.sequelize, ctxOf(req), parseInput(ProcedureListQuery, req.query)));
  });
  r.get('/procedures/:slug', async (req, res) => {
    const slug = req.params.slug;
    if (typeof slug !== 'string' || !/^[a-z0-9-]{1,80}$/.test(slug)) throw notFound('A published procedure with that name');
    res.json(await bench.getVersionForBench(deps.sequelize, ctxOf(req), { slug }));
  });
  r.get('/versions/:id', async (req, res) => {
    res.json(await bench.getVersionForBench(deps.sequelize, ctxOf(req), { versionId: idParam(req, 'id', 'That procedure version') }));
  });
  return r;
}
