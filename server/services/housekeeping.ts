import { QueryTypes } from 'sequelize';
import type { AppDeps } from '../deps';
import { sweepUnnamedPictures } from './step-picture.service';

/**
 * Marks diagnoses left untouched past each shop's abandon time as abandoned. Runs every few
 * minutes; one UPDATE, so it is safe with several app servers.
 */
export async function markAbandoned(deps: AppDeps): Promise<number> {
  const [, count] = (await deps.sequelize.query(
    `UPDATE diagnoses d SET status = 'abandoned', ended_at = d.last_activity_at, updated_at = now()
       FROM shops s
      WHERE d.shop_id = s.id AND d.status = 'active'
        AND d.last_activity_at < now() - make_interval(secs => 3600 * COALESCE((s.settings->>'abandonAfterHours')::float8, :fallback))`,
    { replacements: { fallback: deps.config.ABANDON_AFTER_HOURS }, type: QueryTypes.UPDATE },
  )) as unknown as [unknown, number];
  return Number(count ?? 0);
}

/** Drops sign-in and reset counts whose window has passed. */
export async function pruneRateLimits(deps: AppDeps): Promise<void> {
  await deps.sequelize.query('DELETE FROM rate_limits WHERE expire < (extract(epoch FROM now()) * 1000)::bigint');
}

export function startHousekeeping(deps: AppDeps): () => void {
  const sweep = () => {
    markAbandoned(deps).catch((err: unknown) => deps.log('housekeeping failed', err));
    pruneRateLimits(deps).catch((err: unknown) => deps.log('housekeeping failed', err));
  };
  const timer = setInterval(sweep, 5 * 60 * 1000);
  timer.unref();
  sweep();
  // reads every version document of the shops with old pictures, so hourly rather than every sweep
  const pictures = () => { sweepUnnamedPictures(deps).catch((err: unknown) => deps.log('housekeeping failed', err)); };
  const pictureTimer = setInterval(pictures, 60 * 60 * 1000);
  pictureTimer.unref();
  pictures();
  return () => { clearInterval(timer); clearInterval(pictureTimer); };
}
