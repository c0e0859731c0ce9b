import { noticePreferencesInputSchema } from '../../shared/api/notices';
import { currentUser } from '../auth/current-user';
import { setNoticePreferences } from '../commands/noticePreferences';
import { presentNoticePreferences } from '../presenters/notices';
import { noticeSettings } from '../queries/notices';
import { defineRoutes } from './define';
import { parse } from './validate';

/** /api/account: the signed-in user's own settings (every role has them; API tokens do not). */
export const accountRoutes = defineRoutes('/account', [
  {
    method: 'get',
    path: '/notices',
    guard: 'signedIn',
    handler: async (req, res) => {
      res.json(presentNoticePreferences(await noticeSettings(currentUser(req).id)));
    },
  },
  {
    method: 'put',
    path: '/notices',
    guard: 'signedIn',
    handler: async (req, res) => {
      const { notices } = parse(noticePreferencesInputSchema, req.body);
      const user = currentUser(req);
      await setNoticePreferences({ user, changes: notices });
      res.json(presentNoticePreferences(await noticeSettings(user.id)));
    },
  },
]);
