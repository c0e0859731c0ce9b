import type { NoticePreferencesInput } from '../../shared/api/notices';
import type { User } from '../models/User';
import { saveNoticeSettings } from '../queries/notices';

/**
 * Turns kinds of notice mail on or off for the user themself (kinds not named keep their setting).
 * Invitations are not notices: they cannot be turned off.
 */
export async function setNoticePreferences(input: { user: User; changes: NoticePreferencesInput['notices'] }): Promise<void> {
  await saveNoticeSettings(input.user.id, input.changes);
}
