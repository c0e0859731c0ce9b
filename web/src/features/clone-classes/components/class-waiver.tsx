import { useState, type FormEvent } from 'react';
import type { CloneClassDetailDTO } from '@shared/api/snapshots';
import { Button } from '@/components/button';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { TextAreaField } from '@/components/textarea-field';
import { formatDateTime } from '@/lib/format';
import { useCloneClassWaiver } from '@/features/clone-classes/api/waive-clone-class';

/** The badge a waived class carries, with the lead's reason as its title. */
export function WaivedBadge({ reason }: { reason: string }) {
  return (
    <span title={reason} className="rounded-sm border border-amber/40 bg-amber-soft px-1.5 py-0.5 text-[11px] font-semibold text-amber-strong">
      waived
    </span>
  );
}

/**
 * A class's waiver: the active one with its reason (and, for a lead, "Lift waiver"), how the last
 * one ended when a new member joined in this snapshot, and for a lead "Waive…" with a required
 * reason and an optional "until release".
 */
export function ClassWaiver({ detail, mayWaive }: { detail: CloneClassDetailDTO; mayWaive: boolean }) {
  const { waive, lift } = useCloneClassWaiver(detail.id);
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  const [untilLabel, setUntilLabel] = useState('');
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    waive.mutate({ reason, untilLabel: untilLabel.trim() || undefined }, { onSuccess: () => setOpen(false) });
  };
  const w = detail.waiver;
  return (
    <div className="space-y-2 text-sm">
      {detail.waiverEnded ? (
        <Notice tone="warning">
          Its waiver ended in {detail.waiverEnded.snapshotLabel}: {detail.waiverEnded.reason}.
        </Notice>
      ) : null}
      {w ? (
        <div className="flex flex-wrap items-center gap-3" aria-label="Waiver">
          <WaivedBadge reason={w.reason} />
          <span>{w.reason}</span>
          <span className="text-xs text-muted">
            {w.untilLabel ? `until release ${w.untilLabel} · ` : ''}
            {w.createdByName ?? 'a former member'}, {formatDateTime(w.createdAt)}
          </span>
          {mayWaive ? (
            <Button variant="secondary" onClick={() => lift.mutate()} disabled={lift.isPending}>
              Lift waiver
            </Button>
          ) : null}
        </div>
      ) : mayWaive && !open ? (
        <Button variant="secondary" onClick={() => setOpen(true)}>
          Waive…
        </Button>
      ) : null}
      {!w && open ? (
        <form onSubmit={submit} aria-label="Waive this clone class" className="max-w-xl space-y-2">
          <TextAreaField label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} required maxLength={500} rows={2} />
          <TextField
            label="Until release (optional)"
            value={untilLabel}
            onChange={(e) => setUntilLabel(e.target.value)}
            maxLength={100}
            hint="The waiver ends by itself when this release, or a later version of it, is loaded."
          />
          <div className="flex gap-2">
            <Button type="submit" disabled={waive.isPending}>
              Waive
            </Button>
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
          </div>
        </form>
      ) : null}
      {waive.error ? <Notice tone="error">{errorMessage(waive.error)}</Notice> : null}
      {lift.error ? <Notice tone="error">{errorMessage(lift.error)}</Notice> : null}
    </div>
  );
}
