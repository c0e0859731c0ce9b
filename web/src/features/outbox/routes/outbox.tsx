import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { MessageView } from '@/features/outbox/components/message-view';
import { OutboxTable } from '@/features/outbox/components/outbox-table';

/** A page number from the URL; anything else is page 1. */
function pageFrom(raw: string | null): number {
  const page = Number(raw);
  return Number.isInteger(page) && page >= 1 && page <= 1000 ? page : 1;
}

/** /outbox (admins): the mail the local mail server received, and one message read in full. */
export function OutboxRoute() {
  const [params, setParams] = useSearchParams();
  const page = pageFrom(params.get('page'));
  const selectedId = params.get('message') ?? undefined;
  const hrefFor = (id: string) => `?${new URLSearchParams({ ...(page > 1 ? { page: String(page) } : {}), message: id })}`;
  return (
    <div className="max-w-7xl">
      <PageHeader
        title="Outbox"
        subtitle="Mail Doublet sent to people of your organisation, as the local mail server received it."
      />
      <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <Panel title="Messages">
          <OutboxTable
            page={page}
            selectedId={selectedId}
            hrefFor={hrefFor}
            onPage={(next) => setParams(next > 1 ? { page: String(next) } : {})}
          />
        </Panel>
        <Panel title="Message">
          {selectedId ? <MessageView id={selectedId} /> : <p className="text-sm text-muted">Choose a message to read it.</p>}
        </Panel>
      </div>
    </div>
  );
}
