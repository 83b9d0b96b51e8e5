import { Router } from 'express';
import { z } from 'zod';
import { parseOrThrow } from '../lib/validate';
import { emailSchema, labNameSchema, nameSchema, noQuery, roleSchema } from './account-schemas';
import { currentUser } from './current-user';
import { assertCan } from './policy';
import type { PeopleService } from './people.service';

/** An organisation has a handful of sites; the bound keeps a request small. */
const siteIdsSchema = z.array(z.uuid('Not a site id')).max(100, 'At most 100 sites');
const invitationBody = z.strictObject({
  email: emailSchema,
  name: nameSchema,
  role: roleSchema,
  labName: labNameSchema.optional(),
  siteIds: siteIdsSchema,
});
const changesBody = z
  .strictObject({
    name: nameSchema.optional(),
    role: roleSchema.optional(),
    labName: labNameSchema.nullable().optional(),
    siteIds: siteIdsSchema.optional(),
    isDisabled: z.boolean().optional(),
  })
  .refine((changes) => Object.keys(changes).length > 0, 'Say what to change');
const idParams = z.strictObject({ id: z.uuid('Not a person id') });

/** `People & sites` for admins: list, invite (by e-mail), re-send, change role and sites, disable. */
export function peopleRoutes(people: PeopleService): Router {
  const router = Router();

  router.get('/people', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'people:manage');
    parseOrThrow(noQuery, request.query, 'query');
    response.json({ items: await people.list(user) });
  });

  router.post('/people/invitations', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'people:manage');
    parseOrThrow(noQuery, request.query, 'query');
    const input = parseOrThrow(invitationBody, request.body, 'invitation');
    response.status(201).json(await people.invite(user, input));
  });

  router.post('/people/:id/invitation', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'people:manage');
    const { id } = parseOrThrow(idParams, request.params, 'person id');
    parseOrThrow(noQuery, request.query, 'query');
    response.status(201).json(await people.resendInvitation(user, id));
  });

  router.patch('/people/:id', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'people:manage');
    const { id } = parseOrThrow(idParams, request.params, 'person id');
    parseOrThrow(noQuery, request.query, 'query');
    const changes = parseOrThrow(changesBody, request.body, 'changes');
    response.json(await people.update(user, id, changes));
  });

  return router;
}
