import { QueryState } from '@/components/data-state';
import { formatDateTime } from '@/lib/format';
import { useOutboxMessage } from '@/features/outbox/api/get-outbox-message';

/**
 * One received message: its header lines, the text body, and the HTML body as the recipient's
 * mail program would render it. The HTML comes from the message, so it is shown only inside an
 * iframe with an empty `sandbox` attribute: no script runs, no form submits, and the frame gets
 * an opaque origin, so it can read neither the app's cookies nor its pages.
 */
export function MessageView({ id }: { id: string }) {
  const query = useOutboxMessage(id);
  if (!query.data) return <QueryState query={query} what="the message" />;
  const { message } = query.data;
  return (
    <article aria-label="Message" className="space-y-4">
      <div>
        <h3 className="text-base font-semibold">{message.subject || '(no subject)'}</h3>
        <dl className="mt-2 grid grid-cols-[5rem_1fr] gap-x-3 gap-y-1 text-sm">
          <dt className="text-muted">From</dt>
          <dd className="font-mono text-xs break-all">{message.from}</dd>
          <dt className="text-muted">To</dt>
          <dd className="font-mono text-xs break-all">{message.to}</dd>
          <dt className="text-muted">Received</dt>
          <dd className="font-mono text-xs tabular-nums">{formatDateTime(message.receivedAt)}</dd>
        </dl>
      </div>
      <section aria-label="Text">
        <h4 className="mb-1 text-xs font-semibold tracking-wider text-muted uppercase">Text</h4>
        <pre className="max-h-80 overflow-auto rounded-sm border border-line bg-paper p-3 font-mono text-xs whitespace-pre-wrap">
          {message.text || '(no text part)'}
        </pre>
      </section>
      <section aria-label="HTML">
        <h4 className="mb-1 text-xs font-semibold tracking-wider text-muted uppercase">HTML</h4>
        {message.html ? (
          <iframe
            title={`HTML of “${message.subject}”`}
            sandbox=""
            srcDoc={message.html}
            referrerPolicy="no-referrer"
            className="h-72 w-full rounded-sm border border-line bg-white"
          />
        ) : (
          <p className="text-sm text-muted">This message has no HTML part.</p>
        )}
      </section>
    </article>
  );
}
