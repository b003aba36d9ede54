import { Router } from 'express';
import type { AppDeps } from '../deps';
import { ctxOf } from '../auth/context';
import { allow } from '../auth/policy';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import { InviteInput, UpdateRolesInput } from '@shared/schema/auth';
import { ShopSettingsInput, MeterInput } from '@shared/schema/shop';
import * as shop from '../services/shop.service';
import * as meters from '../services/meter.service';
import { AppError } from '../lib/errors';

/** Shop administration: members, invitations, settings, meters, and the development mailbox. */
export function shopRoutes(deps: AppDeps): Router {
  const r = Router();
  const admin = allow('shop.manage');

  r.get('/members', admin, async (req, res) => res.json(await shop.listMembers(ctxOf(req))));
  r.patch('/members/:id', admin, async (req, res) => {
    const { roles } = parseInput(UpdateRolesInput, req.body);
    res.json(await shop.updateMemberRoles(deps, ctxOf(req), idParam(req, 'id', 'That member'), roles));
  });
  r.post('/members/:id/disable', admin, async (req, res) => {
    res.json(await shop.setMemberDisabled(deps, ctxOf(req), idParam(req, 'id', 'That member'), true));
  });
  r.post('/members/:id/enable', admin, async (req, res) => {
    res.json(await shop.setMemberDisabled(deps, ctxOf(req), idParam(req, 'id', 'That member'), false));
  });
  r.delete('/members/:id', admin, async (req, res) => {
    await shop.removeMember(deps, ctxOf(req), idParam(req, 'id', 'That member'));
    res.status(204).end();
  });

  r.get('/invitations', admin, async (req, res) => res.json(await shop.listInvitations(ctxOf(req))));
  r.post('/invitations', admin, async (req, res) => {
    const input = parseInput(InviteInput, req.body, 'The invitation');
    res.status(201).json(await shop.invite(deps, ctxOf(req), input));
  });
  r.delete('/invitations/:id', admin, async (req, res) => {
    await shop.revokeInvitation(ctxOf(req), idParam(req, 'id', 'That invitation'));
    res.status(204).end();
  });

  r.get('/settings', async (req, res) => res.json(await shop.getSettings(ctxOf(req))));
  r.put('/settings', admin, async (req, res) => {
    res.json(await shop.updateSettings(ctxOf(req), parseInput(ShopSettingsInput, req.body, 'The settings')));
  });

  r.get('/meters', async (req, res) => res.json(await meters.listMeters(ctxOf(req))));
  r.post('/meters', admin, async (req, res) => {
    res.status(201).json(await meters.createMeter(ctxOf(req), parseInput(MeterInput, req.body, 'The meter')));
  });

  // The fake receiver's mailbox: admins only, and only where the local fakes run.
  r.get('/mail', admin, (_req, res) => {
    if (!deps.mailbox) throw new AppError(404, 'not_found', 'The mailbox page exists only in development, where mail goes to the local receiver.');
    res.json(deps.mailbox.messages().slice(-200).reverse());
  });
  return r;
}
