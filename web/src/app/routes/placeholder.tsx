import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';

/** A page whose feature arrives in a later change: says what it will hold. */
export function PlaceholderRoute({ title, description }: { title: string; description: string }) {
  return (
    <div className="max-w-5xl">
      <PageHeader title={title} subtitle={description} />
      <Panel>
        <p className="text-sm text-muted">Nothing here yet.</p>
      </Panel>
    </div>
  );
}
