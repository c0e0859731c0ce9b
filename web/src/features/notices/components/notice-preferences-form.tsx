import { useState } from 'react';
import { NOTICE_KINDS, NOTICE_LABELS, type NoticeKind } from '@shared/api/notices';
import { QueryState } from '@/components/data-state';
import { Notice, errorMessage } from '@/components/notice';
import { useNoticePreferences, useUpdateNoticePreferences } from '@/features/notices/api/notice-preferences';

/**
 * One checkbox a kind of notice mail; a change is saved at once (each request names its own kind,
 * so quick changes of several boxes do not overwrite each other). A box shows the click at once
 * and the server's setting once the answer is in: a failed save puts the old setting back.
 */
export function NoticePreferencesForm() {
  const preferences = useNoticePreferences();
  const update = useUpdateNoticePreferences();
  const [saving, setSaving] = useState<Partial<Record<NoticeKind, boolean>>>({});
  if (!preferences.data) return <QueryState query={preferences} what="your notice settings" />;
  const notices = { ...preferences.data.notices, ...saving };

  const toggle = (kind: NoticeKind, enabled: boolean) => {
    setSaving((current) => ({ ...current, [kind]: enabled }));
    // mutateAsync settles per call (mutate's own callbacks fire for the latest call only).
    update
      .mutateAsync({ notices: { [kind]: enabled } })
      .catch(() => undefined) // shown by update.isError
      .finally(() =>
        setSaving((current) => {
          const { [kind]: _done, ...rest } = current;
          return rest;
        }),
      );
  };

  return (
    <div className="space-y-3">
      <p className="text-sm text-muted">Doublet mails you when something needs you. Untick what you do not want; invitations always go out.</p>
      <fieldset className="space-y-3">
        <legend className="sr-only">Notice mails you receive</legend>
        {NOTICE_KINDS.map((kind) => (
          <label key={kind} className="flex items-start gap-3 text-sm">
            <input
              type="checkbox"
              name={kind}
              className="mt-0.5 size-4 accent-accent"
              checked={notices[kind]}
              onChange={(event) => toggle(kind, event.currentTarget.checked)}
              aria-describedby={`notice-${kind}-description`}
            />
            <span>
              <span className="font-medium">{NOTICE_LABELS[kind].label}</span>
              <span id={`notice-${kind}-description`} className="block text-muted">
                {NOTICE_LABELS[kind].description}
              </span>
            </span>
          </label>
        ))}
      </fieldset>
      <div aria-live="polite">
        {update.isError ? <Notice tone="error">{errorMessage(update.error)}</Notice> : null}
        {update.isSuccess ? <Notice>Saved.</Notice> : null}
      </div>
    </div>
  );
}
