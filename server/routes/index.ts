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
import { debriefRoutes } from './debrief.routes';

/**
 * Mounts every API router. Each feature adds one line here; everything below requireShop has
 * req.ctx (user, shop, roles) resolved on the server.
 */
export function apiRouter(deps: AppDeps, csrfToken: (req: Request, overwrite?: boolean) => string): Router {
  const api = Router();
  api.use('/health', healthRoutes(deps));
  api.use('/auth', authRoutes(deps, csrfToken));
  api.use(engineRoutes());

  const shop = Router();
  shop.use(requireShop);
  shop.use('/shop', shopRoutes(deps));
  shop.use('/vehicles', vehicleRoutes());
  shop.use('/bench', benchRoutes(deps));
  shop.use('/diagnoses', diagnosisRoutes(deps));
  shop.use('/attachments', attachmentRoutes(deps));
  shop.use('/procedures', procedureRoutes(deps));
  shop.use('/debrief', debriefRoutes(deps));
  api.use(shop);
  return api;
}
