import clsx from 'clsx';
import { ROLE_LABELS, type Role } from '@shared/roles';

const TONES: Record<Role, string> = {
  admin: 'bg-ink text-paper',
  lead: 'bg-accent text-white',
  engineer: 'bg-accent-soft text-accent-strong',
  viewer: 'bg-paper text-muted border border-line',
};

/** A role as a small label. */
export function RoleBadge({ role }: { role: Role }) {
  return (
    <span className={clsx('inline-block rounded-sm px-1.5 py-0.5 font-mono text-[11px] leading-none uppercase', TONES[role])}>
      {ROLE_LABELS[role]}
    </span>
  );
}
