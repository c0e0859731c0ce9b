import { outboxParamsSchema, outboxQuerySchema, type OutboxListDTO, type OutboxMessageAnswerDTO } from '../../shared/api/outbox';
import { currentUser } from '../auth/current-user';
import { NotFoundError } from '../errors';
import { waitingJobs } from '../jobs';
import { OutboxMessage } from '../models/OutboxMessage';
import { authorize } from '../policies';
import { presentOutboxMessage, presentOutboxSummary } from '../presenters/outbox';
import { defineRoutes } from './define';
import { parse } from './validate';

// The list never reads the bodies: they can be large, and the list shows none.
const SUMMARY_FIELDS = ['id', 'organisationId', 'fromAddress', 'toAddresses', 'subject', 'receivedAt', 'sizeBytes'];

/**
 * /api/outbox: admins read the mail the local catcher received for their organisation (mail
 * about it, or to one of its members); other organisations' mail does not exist for them (404).
 */
export const outboxRoutes = defineRoutes('/outbox', [
  {
    method: 'get',
    path: '/',
    guard: 'outbox.read',
    handler: async (req, res) => {
      const query = parse(outboxQuerySchema, req.query);
      const actor = currentUser(req);
      const { rows, count } = await OutboxMessage.findAndCountAll({
        where: { organisationId: actor.organisationId },
        attributes: SUMMARY_FIELDS,
        order: [['receivedAt', 'DESC'], ['id', 'DESC']],
        limit: query.pageSize,
        offset: (query.page - 1) * query.pageSize,
      });
      const waiting = await waitingJobs('mail.send', { organisationId: actor.organisationId });
      const answer: OutboxListDTO = { messages: rows.map(presentOutboxSummary), waiting, total: count, page: query.page, pageSize: query.pageSize };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/:id',
    guard: 'outbox.read',
    handler: async (req, res) => {
      const { id } = parse(outboxParamsSchema, req.params);
      const actor = currentUser(req);
      const message = await OutboxMessage.findOne({ where: { id, organisationId: actor.organisationId } });
      if (!message) throw new NotFoundError('Message');
      authorize(actor, 'outbox.read', message);
      const answer: OutboxMessageAnswerDTO = { message: presentOutboxMessage(message) };
      res.json(answer);
    },
  },
]);
