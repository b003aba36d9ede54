import { Router } from 'express';
import type { AppDeps } from '../deps';
import { ctxOf } from '../auth/context';
import { allow, allowDiagnosisReading } from '../auth/policy';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import { DiagnosisListQuery, DiagnosisStepInput, ReportInput, StartDiagnosisInput } from '@shared/schema/bench';
import * as diagnoses from '../services/diagnosis.service';
import { recordStep } from '../services/diagnosis-step.service';
import { emailReport } from '../services/report.service';

/** Diagnoses on the Bench: start, record steps (the hot path), read the record, e-mail the report. */
export function diagnosisRoutes(deps: AppDeps): Router {
  const r = Router();
  const workers = allow('diagnosis.work');
  const readers = allowDiagnosisReading;
  r.get('/', readers, async (req, res) => res.json(await diagnoses.listDiagnoses(deps, ctxOf(req), parseInput(DiagnosisListQuery, req.query))));
  r.post('/', workers, async (req, res) => {
    const out = await diagnoses.startDiagnosis(deps, ctxOf(req), parseInput(StartDiagnosisInput, req.body, 'The diagnosis'));
    res.status(out.created ? 201 : 200).json(out);
  });
  r.get('/:id', readers, async (req, res) => res.json(await diagnoses.getRecord(deps, ctxOf(req), idParam(req, 'id', 'That diagnosis'))));
  r.post('/:id/steps', workers, async (req, res) => {
    const id = idParam(req, 'id', 'That diagnosis');
    const out = await recordStep(deps, ctxOf(req), id, parseInput(DiagnosisStepInput, req.body, 'The step'));
    res.status(out.duplicate ? 200 : 201).json(out);
  });
  r.post('/:id/report', readers, async (req, res) => {
    const { to } = parseInput(ReportInput, req.body ?? {}, 'The report');
    res.json(await emailReport(deps, ctxOf(req), idParam(req, 'id', 'That diagnosis'), to));
  });
  return r;
}
