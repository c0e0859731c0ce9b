/** Reads and writes of notice preferences: which notice mails each user receives (see README.md). */
import type { Transaction } from 'sequelize';
import type { NoticeKind } from '../../shared/api/notices';
import { execute, select } from '../clone-index/sql';

/** A user a notice may go to. */
export interface NoticeRecipientRow {
  id: string;
  organisationId: string;
  email: string;
  name: string;
  role: string;
}

/**
 * Of these users, the active ones who have not turned this kind of notice off (no row means on),
 * in the order of `userIds`, each once.
 */
export async function noticeRecipients(kind: NoticeKind, userIds: string[], tx?: Transaction): Promise<NoticeRecipientRow[]> {
  const unique = [...new Set(userIds)];
  if (unique.length === 0) return [];
  const rows = await select<NoticeRecipientRow>(
    tx,
    `select u.id, u.organisation_id as "organisationId", u.email, u.name, u.role
       from users u
       left join notice_preferences p on p.user_id = u.id and p.kind = $2
      where u.id = any($1::uuid[]) and u.deactivated_at is null and coalesce(p.enabled, true)`,
    [unique, kind],
  );
  const byId = new Map(rows.map((r) => [r.id, r]));
  return unique.flatMap((id) => byId.get(id) ?? []);
}

/** The kinds a user has set explicitly, with their setting (kinds not listed are on). */
export async function noticeSettings(userId: string, tx?: Transaction): Promise<Map<string, boolean>> {
  const rows = await select<{ kind: string; enabled: boolean }>(tx, 'select kind, enabled from notice_preferences where user_id = $1', [userId]);
  return new Map(rows.map((r) => [r.kind, r.enabled]));
}

/** Stores a user's setting of each of these kinds (others are left as they are). */
export async function saveNoticeSettings(userId: string, settings: Partial<Record<NoticeKind, boolean>>, tx?: Transaction): Promise<void> {
  const entries = Object.entries(settings).filter((e): e is [NoticeKind, boolean] => typeof e[1] === 'boolean');
  if (entries.length === 0) return;
  await execute(
    tx,
    `insert into notice_preferences (user_id, kind, enabled)
     select $1, k, e from unnest($2::text[], $3::boolean[]) as t(k, e)
     on conflict (user_id, kind) do update set enabled = excluded.enabled, updated_at = now()`,
    [userId, entries.map((e) => e[0]), entries.map((e) => e[1])],
  );
}
