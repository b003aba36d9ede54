import { Router } from 'express';
import type { AppDeps } from '../deps';
import { ctxOf } from '../auth/context';
import { allow, allowDiagnosisReading } from '../auth/policy';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import {
  advisorDraftBodySchema, analyticsQuerySchema, coachingNoteBodySchema, diagnosisListQuerySchema,
} from '@shared/stats/debrief-schema';
import { analyticsScope, readSqlOf, sqlOf, type Sql } from '../services/debrief-scope';
import { diagnosesCsv, listDiagnoses } from '../services/debrief-diagnoses.service';
import { replayDiagnosis } from '../services/debrief-replay.service';
import { addCoachingNote } from '../services/coaching.service';
import { findingsAnalytics, readingsAnalytics, stepsAnalytics, timesAnalytics } from '../services/debrief-analytics.service';
import { adviseVersion, draftFromAdvice } from '../services/debrief-advisor.service';
import { debriefProcedures, debriefTechnicians } from '../services/debrief-procedures.service';

/** Debrief: trainers and leads read the shop's diagnoses and analytics; Bench workers their own diagnoses. */
export function debriefRoutes(deps: AppDeps): Router {
  const r = Router();
  // Writes, and the reads around them, use the primary; analytics and long lists may use the replica.
  const sql = sqlOf(deps);
  const reads = (req: { headers: { cookie?: string | undefined } }) => readSqlOf(deps, req.headers.cookie);
  const readers = allowDiagnosisReading;
  const analysts = allow('analytics.read');

  r.get('/procedures', analysts, async (req, res) => { res.json(await debriefProcedures(reads(req), ctxOf(req))); });
  r.get('/technicians', analysts, async (req, res) => { res.json(await debriefTechnicians(reads(req), ctxOf(req))); });
  r.get('/diagnoses', readers, async (req, res) => {
    res.json(await listDiagnoses(reads(req), ctxOf(req), parseInput(diagnosisListQuerySchema, req.query, 'The filter')));
  });
  r.get('/diagnoses.csv', readers, async (req, res) => {
    const csv = await diagnosesCsv(reads(req), ctxOf(req), parseInput(diagnosisListQuerySchema, req.query, 'The filter'));
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="diagnoses-${new Date().toISOString().slice(0, 10)}.csv"`);
    res.send(csv);
  });
  r.get('/diagnoses/:id', readers, async (req, res) => {
    res.json(await replayDiagnosis(sql, ctxOf(req), idParam(req, 'id', 'That diagnosis')));
  });
  r.post('/diagnoses/:id/coaching-notes', allow('coaching.write'), async (req, res) => {
    const body = parseInput(coachingNoteBodySchema, req.body, 'The coaching note');
    res.status(201).json(await addCoachingNote(sql, ctxOf(req), idParam(req, 'id', 'That diagnosis'), body));
  });

  const analytics = (compute: (read: Sql, s: Awaited<ReturnType<typeof analyticsScope>>) => Promise<unknown>) =>
    async (req: Parameters<Parameters<typeof r.get>[1]>[0], res: Parameters<Parameters<typeof r.get>[1]>[1]) => {
      const read = reads(req);
      const scope = await analyticsScope(read, ctxOf(req), parseInput(analyticsQuerySchema, req.query, 'The analytics filter'));
      res.json(await compute(read, scope));
    };
  r.get('/analytics/steps', analysts, analytics(stepsAnalytics));
  r.get('/analytics/findings', analysts, analytics(findingsAnalytics));
  r.get('/analytics/readings', analysts, analytics(readingsAnalytics));
  r.get('/analytics/times', analysts, analytics(timesAnalytics));
  r.get('/analytics/advisor', analysts, analytics(adviseVersion));
  r.post('/advisor/drafts', allow('advice.draft'), async (req, res) => {
    res.status(201).json(await draftFromAdvice(deps, sql, ctxOf(req), parseInput(advisorDraftBodySchema, req.body, 'The proposal')));
  });
  return r;
}
