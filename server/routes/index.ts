import { Router, type Request } from 'express';
import type { AppDeps } from '../deps';
import { requireShop } from '../auth/context';
import { authRoutes } from './auth.routes';
import { shopRoutes } from './shop.routes';
import { vehicleRoutes } from './vehicle.routes';
import { healthRoutes } from './health.routes';
import { engineRoutes } from './engine.routes';
import { benchRoutes } from './bench.routes';
import { diagnosisRoutes } from './diagnosis.routes';
import { attachmentRoutes } from './attachment.routes';
import { procedureRoutes } from './procedure.routes';
import { pictureRoutes, pictureUploadRoute } from './picture.routes';
import { debriefRoutes } from './debrief.routes';

/**
 * Mounts every API router. Each feature adds one line here; every shop area has req.ctx (user,
 * shop, roles) resolved on the server by requireShop.
 */
export function apiRouter(deps: AppDeps, csrfToken: (req: Request, overwrite?: boolean) => string): Router {
  const api = Router();
  api.use('/health', healthRoutes(deps));
  api.use('/auth', authRoutes(deps, csrfToken));
  api.use(engineRoutes());

  // Shop data: each area behind requireShop, mounted directly (the Bench's step route first: it is
  // the busiest), so a request passes one router per level and no more.
  const areas: [string, Router][] = [
    ['/diagnoses', diagnosisRoutes(deps)], ['/bench', benchRoutes(deps)], ['/attachments', attachmentRoutes(deps)],
    ['/vehicles', vehicleRoutes()], ['/procedures', procedureRoutes(deps)], ['/procedures', pictureUploadRoute(deps)], ['/pictures', pictureRoutes(deps)], ['/debrief', debriefRoutes(deps)], ['/shop', shopRoutes(deps)],
  ];
  for (const [path, router] of areas) api.use(path, requireShop, router);
  return api;
}
