import { Router, type Request } from 'express';
import type { AppDeps } from '../deps';
import { ctxOf } from '../auth/context';
import { allow } from '../auth/policy';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import * as inputs from '../services/procedure-inputs';
import * as procedures from '../services/procedure.service';
import * as versions from '../services/procedure-version.service';
import * as review from '../services/procedure-review.service';
import * as transfer from '../services/procedure-transfer.service';

const ids = (req: Request) => ({
  procedureId: idParam(req, 'id', 'That procedure'),
  versionId: idParam(req, 'versionId', 'That version'),
});

/**
 * Drafting: authors edit drafts and send them for review; leads comment, publish, send back and
 * retire; every member may read published versions. `POST /lint` is mounted by the app itself.
 */
export function procedureRoutes(deps: AppDeps): Router {
  const r = Router();
  const author = allow('procedure.author');
  const lead = allow('procedure.review');
  const drafting = allow('procedure.draft');

  r.get('/', async (req, res) => {
    res.json(await procedures.listProcedures(deps, ctxOf(req), parseInput(inputs.procedureListQuery, req.query, 'The search')));
  });
  r.post('/', author, async (req, res) => {
    const { meta } = parseInput(inputs.createProcedureBody, req.body, 'The new procedure');
    res.status(201).json(await procedures.createProcedure(deps, ctxOf(req), { meta }));
  });
  r.post('/import', author, async (req, res) => {
    res.status(201).json(await transfer.importProcedure(deps, ctxOf(req), parseInput(inputs.importBody, req.body, 'The import')));
  });
  r.get('/:id', async (req, res) => res.json(await procedures.getProcedure(ctxOf(req), idParam(req, 'id', 'That procedure'))));
  r.post('/:id/duplicate', author, async (req, res) => {
    const { title } = parseInput(inputs.duplicateProcedureBody, req.body ?? {}, 'The copy');
    res.status(201).json(await procedures.duplicateProcedure(deps, ctxOf(req), idParam(req, 'id', 'That procedure'), title));
  });
  r.post('/:id/archive', drafting, async (req, res) => {
    const { archived } = parseInput(inputs.archiveProcedureBody, req.body);
    res.json(await procedures.setArchived(ctxOf(req), idParam(req, 'id', 'That procedure'), archived));
  });
  r.post('/:id/drafts', author, async (req, res) => {
    const { fromVersionId } = parseInput(inputs.newDraftBody, req.body ?? {});
    res.status(201).json(await versions.startDraft(deps, ctxOf(req), idParam(req, 'id', 'That procedure'), fromVersionId));
  });

  r.get('/:id/versions/:versionId', async (req, res) => {
    const { procedureId, versionId } = ids(req);
    res.json(await versions.getVersion(ctxOf(req), procedureId, versionId));
  });
  r.put('/:id/versions/:versionId', author, async (req, res) => {
    res.json(await versions.saveDraft(deps, ctxOf(req), ids(req), parseInput(inputs.saveDraftBody, req.body, 'The draft')));
  });
  r.post('/:id/versions/:versionId/submit', author, async (req, res) => {
    res.json(await versions.moveVersion(deps, ctxOf(req), ids(req), 'submit'));
  });
  r.post('/:id/versions/:versionId/take-back', author, async (req, res) => {
    res.json(await versions.moveVersion(deps, ctxOf(req), ids(req), 'take-back'));
  });
  r.post('/:id/versions/:versionId/send-back', lead, async (req, res) => {
    const { comment } = parseInput(inputs.reviewDecisionBody, req.body ?? {});
    res.json(await review.sendBack(deps, ctxOf(req), ids(req), comment));
  });
  r.post('/:id/versions/:versionId/publish', lead, async (req, res) => {
    res.json(await versions.moveVersion(deps, ctxOf(req), ids(req), 'publish'));
  });
  r.post('/:id/versions/:versionId/retire', lead, async (req, res) => {
    res.json(await versions.moveVersion(deps, ctxOf(req), ids(req), 'retire'));
  });
  r.get('/:id/versions/:versionId/export', async (req, res) => {
    const { file, filename } = await transfer.exportVersion(deps, ctxOf(req), ids(req));
    res.attachment(filename).type('application/json').send(JSON.stringify(file, null, 2));
  });
  r.get('/:id/versions/:versionId/comments', drafting, async (req, res) => {
    res.json(await review.listComments(ctxOf(req), ids(req)));
  });
  r.post('/:id/versions/:versionId/comments', drafting, async (req, res) => {
    res.status(201).json(await review.addComment(ctxOf(req), ids(req), parseInput(inputs.commentBody, req.body, 'The comment')));
  });
  return r;
}
