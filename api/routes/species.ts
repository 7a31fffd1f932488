import { Router, type Request, type Response } from 'express';
import { speciesIdParams, speciesQuery } from '@shared/schemas/livestock';
import { speciesInput } from '@shared/schemas/species';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { createCompanySpecies, getSpecies, searchSpecies } from '../services/species';

export const speciesRouter = Router();

speciesRouter.get('/', can('species:read'), validate({ query: speciesQuery }), getAll);
speciesRouter.post('/', can('species:write'), validate({ body: speciesInput }), postOne);
speciesRouter.get('/:speciesId', can('species:read'), validate({ params: speciesIdParams }), getOne);

async function getAll(req: Request, res: Response) {
  res.json(await searchSpecies(depsOf(req).db, requireActor(req.actor), parsed(res, 'query', speciesQuery)));
}

async function postOne(req: Request, res: Response) {
  const input = parsed(res, 'body', speciesInput);
  res.status(201).json(await createCompanySpecies(depsOf(req).db, requireActor(req.actor), input));
}

async function getOne(req: Request, res: Response) {
  const { speciesId } = parsed(res, 'params', speciesIdParams);
  res.json(await getSpecies(depsOf(req).db, requireActor(req.actor), speciesId));
}
