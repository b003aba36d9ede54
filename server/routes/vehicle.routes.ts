import { Router } from 'express';
import { ctxOf } from '../auth/context';
import { allow } from '../auth/policy';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import { VehicleInput, VehicleListQuery } from '@shared/schema/vehicle';
import * as vehicles from '../services/vehicle.service';

/** Every member may look machines up; admins and Bench workers may add and edit them. */
export function vehicleRoutes(): Router {
  const r = Router();
  const editors = allow('vehicle.edit');
  r.get('/', async (req, res) => {
    const { q } = parseInput(VehicleListQuery, req.query);
    res.json(await vehicles.listVehicles(ctxOf(req), q));
  });
  r.get('/:id', async (req, res) => res.json(await vehicles.getVehicle(ctxOf(req), idParam(req, 'id', 'That machine'))));
  r.post('/', editors, async (req, res) => {
    res.status(201).json(await vehicles.createVehicle(ctxOf(req), parseInput(VehicleInput, req.body, 'The machine')));
  });
  r.put('/:id', editors, async (req, res) => {
    const id = idParam(req, 'id', 'That machine');
    res.json(await vehicles.updateVehicle(ctxOf(req), id, parseInput(VehicleInput, req.body, 'The machine')));
  });
  return r;
}
