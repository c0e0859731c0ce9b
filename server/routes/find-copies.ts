import { findCopiesSchema, type FindCopiesResultDTO } from '../../shared/api/find-copies';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { currentUser } from '../auth/current-user';
import { findCopies } from '../commands/findCopies';
import { authorize } from '../policies';
import { presentFoundCopy } from '../presenters/found-copy';
import { defineRoutes } from './define';
import { parse } from './validate';

/** /api/find-copies: paste a snippet, get every indexed copy of it (the snippet is not stored). */
export const findCopiesRoutes = defineRoutes('/find-copies', [
  {
    method: 'post',
    path: '/',
    guard: 'findCopies.use',
    handler: async (req, res) => {
      const input = parse(findCopiesSchema, req.body);
      const actor = currentUser(req);
      authorize(actor, 'findCopies.use', { organisationId: actor.organisationId });
      const threshold = input.threshold ?? DEFAULT_REPOSITORY_SETTINGS.threshold;
      // The analysis stops when the client goes away; there is no one left to answer then.
      const gone = new AbortController();
      res.on('close', () => gone.abort());
      const copies = await findCopies({ ...input, threshold, organisationId: actor.organisationId }, { signal: gone.signal }).catch((error: unknown) => {
        if (gone.signal.aborted) return undefined;
        throw error;
      });
      if (!copies) return;
      const answer: FindCopiesResultDTO = {
        threshold,
        copies: copies.map(presentFoundCopy),
      };
      res.json(answer);
    },
  },
]);
