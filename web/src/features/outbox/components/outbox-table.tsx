import clsx from 'clsx';
import { Link } from 'react-router-dom';
import { Button } from '@/components/button';
import { QueryState } from '@/components/data-state';
import { Notice } from '@/components/notice';
import { formatDateTime } from '@/lib/format';
import { OUTBOX_PAGE_SIZE, useOutbox } from '@/features/outbox/api/get-outbox';

/**
 * The organisation's received mail, newest first: recipient, subject, time. A row links to the
 * message (`?message=id`, kept in the URL with the page).
 */
export function OutboxTable({
  page,
  selectedId,
  hrefFor,
  onPage,
}: {
  page: number;
  selectedId?: string;
  hrefFor: (id: string) => string;
  onPage: (page: number) => void;
}) {
  const outbox = useOutbox(page);
  if (!outbox.data) return <QueryState query={outbox} what="the outbox" />;
  const { messages, total, waiting } = outbox.data;
  const waitingNotice =
    waiting > 0 ? (
      <Notice tone="warning">
        {waiting === 1 ? '1 message is' : `${waiting} messages are`} waiting for the mail server. Doublet keeps trying; it
        appears here once delivered.
      </Notice>
    ) : null;
  if (total === 0) {
    return (
      <div className="space-y-3">
        {waitingNotice}
        <p className="text-sm text-muted">
          No mail yet. Invitations and other mail Doublet sends to people of your organisation appear here once the local
          mail server has received them.
        </p>
      </div>
    );
  }
  const pages = Math.max(1, Math.ceil(total / OUTBOX_PAGE_SIZE));
  return (
    <div className="space-y-3">
      {waitingNotice}
      <table className="w-full table-fixed text-sm">
        <thead>
          <tr className="text-left text-xs tracking-wide text-muted uppercase">
            <th className="w-[34%] pb-2 font-semibold">To</th>
            <th className="pb-2 font-semibold">Subject</th>
            <th className="w-36 pb-2 font-semibold">Received</th>
          </tr>
        </thead>
        <tbody>
          {messages.map((m) => (
            <tr key={m.id} className={clsx('border-t border-line align-top', m.id === selectedId && 'bg-accent-soft')}>
              <td className="truncate py-2 pr-3 font-mono text-xs" title={m.to}>
                {m.to}
              </td>
              <td className="truncate py-2 pr-3">
                <Link to={hrefFor(m.id)} className="text-accent hover:underline" aria-current={m.id === selectedId ? 'true' : undefined}>
                  {m.subject || '(no subject)'}
                </Link>
              </td>
              <td className="py-2 font-mono text-xs text-muted tabular-nums">{formatDateTime(m.receivedAt)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {pages > 1 ? (
        <nav aria-label="Outbox pages" className="flex items-center justify-between text-sm">
          <span className="font-mono text-xs text-muted tabular-nums">
            page {page} of {pages} · {total} messages
          </span>
          <div className="flex gap-2">
            <Button variant="secondary" className="px-2 py-1 text-xs" disabled={page <= 1} onClick={() => onPage(page - 1)}>
              Newer
            </Button>
            <Button variant="secondary" className="px-2 py-1 text-xs" disabled={page >= pages} onClick={() => onPage(page + 1)}>
              Older
            </Button>
          </div>
        </nav>
      ) : null}
    </div>
  );
}
