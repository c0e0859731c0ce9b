import { useState } from 'react';
import type { CreatedApiTokenDTO } from '@shared/api/tokens';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { ApiTokenList } from '@/features/api-tokens/components/api-token-list';
import { CreateApiTokenForm } from '@/features/api-tokens/components/create-api-token-form';
import { NewTokenSecret } from '@/features/api-tokens/components/new-token-secret';
import { useRepositories } from '@/features/repositories/api/get-repositories';

/** /api-tokens: leads create, list and revoke repository-scoped tokens for CI. */
export function ApiTokensRoute() {
  const [created, setCreated] = useState<CreatedApiTokenDTO>();
  const repositories = useRepositories();
  return (
    <div className="max-w-6xl">
      <PageHeader
        title="API tokens"
        subtitle="A token lets a CI job read one repository's results (and, later, upload its snapshots). Nothing else."
      />
      <div className="grid items-start gap-4 xl:grid-cols-[1fr_340px]">
        <Panel title="Tokens">
          <ApiTokenList />
        </Panel>
        <Panel title={created ? 'Your new token' : 'Create a token'}>
          {created ? <NewTokenSecret created={created} onDone={() => setCreated(undefined)} /> : <CreateApiTokenForm
              repositories={{ repositories: repositories.data?.repositories, isPending: repositories.isPending, error: repositories.error }}
              onCreated={setCreated}
            />}
        </Panel>
      </div>
    </div>
  );
}
