import { Router } from 'express';
import { z } from 'zod';
import { assertCan } from '../accounts/policy';
import { currentUser } from '../accounts/current-user';
import { AppError } from '../lib/errors';
import { parseOrThrow } from '../lib/validate';
import { MailMessage } from './mail-message.model';

const listQuery = z.strictObject({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
});
const idParams = z.strictObject({ id: z.uuid() });

function summary(message: MailMessage) {
  return {
    id: message.id,
    recipients: message.recipients.split(', ').filter(Boolean),
    subject: message.subject,
    status: message.status,
    errorMessage: message.errorMessage,
    attachments: JSON.parse(message.attachments) as unknown[],
    createdAt: message.createdAt?.toISOString() ?? null,
  };
}

/** `GET /api/outbox` and `GET /api/outbox/:id`: the e-mail the system sent for this organisation (admins). */
export function outboxRoutes(): Router {
  const router = Router();

  router.get('/outbox', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'outbox:read');
    const query = parseOrThrow(listQuery, request.query, 'query');
    const { rows, count } = await MailMessage.findAndCountAll({
      where: { organizationId: user.organizationId },
      order: [['createdAt', 'DESC'], ['id', 'DESC']],
      limit: query.limit,
      offset: query.offset,
    });
    response.json({ items: rows.map(summary), total: count });
  });

  router.get('/outbox/:id', async (request, response) => {
    const user = currentUser(request);
    assertCan(user, 'outbox:read');
    const { id } = parseOrThrow(idParams, request.params, 'message id');
    parseOrThrow(z.strictObject({}), request.query, 'query');
    const message = await MailMessage.findOne({ where: { id, organizationId: user.organizationId } });
    if (!message) {
      throw new AppError('not_found', 'No such message');
    }
    response.json({ ...summary(message), textBody: message.textBody, htmlBody: message.htmlBody });
  });

  return router;
}
