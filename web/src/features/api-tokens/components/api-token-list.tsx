import { useState } from 'react';
import type { ApiTokenDTO } from '@shared/api/tokens';
import { Button } from '@/components/button';
import { QueryState } from '@/components/data-state';
import { Notice, errorMessage } from '@/components/notice';
import { formatDateTime } from '@/lib/format';
import { useApiTokens } from '@/features/api-tokens/api/get-api-tokens';
import { useRevokeApiToken } from '@/features/api-tokens/api/revoke-api-token';

function status(token: ApiTokenDTO): string {
  if (token.revokedAt) return `Revoked ${formatDateTime(token.revokedAt)}`;
  if (token.expiresAt && Date.parse(token.expiresAt) <= Date.now()) return `Expired ${formatDateTime(token.expiresAt)}`;
  return token.expiresAt ? `Expires ${formatDateTime(token.expiresAt)}` : 'No expiry';
}

/** Revoke, behind a second step that names the token and says what stops. */
function RevokeToken({ token }: { token: ApiTokenDTO }) {
  const revoke = useRevokeApiToken();
  const [confirming, setConfirming] = useState(false);
  if (token.revokedAt) return null;
  if (!confirming) {
    return (
      <Button variant="danger" className="px-2 py-1 text-xs" onClick={() => setConfirming(true)}>
        Revoke…
      </Button>
    );
  }
  return (
    <div className="space-y-2 text-xs">
      {revoke.isError ? <Notice tone="error">{errorMessage(revoke.error)}</Notice> : null}
      <p>Revoke {token.name}? Anything using it is refused from its next request.</p>
      <div className="flex gap-2">
        <Button variant="danger" className="border-danger px-2 py-1 text-xs" disabled={revoke.isPending} onClick={() => revoke.mutate(token.id)}>
          Revoke for good
        </Button>
        <Button variant="secondary" className="px-2 py-1 text-xs" disabled={revoke.isPending} onClick={() => setConfirming(false)}>
          Keep it
        </Button>
      </div>
    </div>
  );
}

/** The organisation's tokens: name, repository, prefix, created, expiry or revocation, last use. */
export function ApiTokenList() {
  const tokens = useApiTokens();
  if (!tokens.data) return <QueryState query={tokens} what="API tokens" />;
  if (tokens.data.apiTokens.length === 0) return <p className="text-sm text-muted">No API tokens yet.</p>;
  return (
    <table className="w-full text-left text-sm">
      <thead className="text-xs tracking-wide text-muted uppercase">
        <tr>
          <th className="pb-2 font-semibold">Name</th>
          <th className="pb-2 font-semibold">Repository</th>
          <th className="pb-2 font-semibold">Starts with</th>
          <th className="pb-2 font-semibold">Created</th>
          <th className="pb-2 font-semibold">State</th>
          <th className="pb-2 font-semibold">Last used</th>
          <th className="pb-2" />
        </tr>
      </thead>
      <tbody>
        {tokens.data.apiTokens.map((token) => (
          <tr key={token.id} className={token.revokedAt ? 'border-t border-line text-muted' : 'border-t border-line'}>
            <td className="py-2 pr-4 font-medium">{token.name}</td>
            <td className="py-2 pr-4 font-mono text-xs whitespace-nowrap">{token.repositoryName}</td>
            <td className="py-2 pr-4 font-mono text-xs whitespace-nowrap">{token.prefix}…</td>
            <td className="py-2 pr-4 text-xs whitespace-nowrap">
              {formatDateTime(token.createdAt)}
              {token.createdByName ? <div className="text-muted">by {token.createdByName}</div> : null}
            </td>
            <td className="py-2 pr-4 text-xs whitespace-nowrap">{status(token)}</td>
            <td className="py-2 pr-4 text-xs whitespace-nowrap">{token.lastUsedAt ? formatDateTime(token.lastUsedAt) : 'Never'}</td>
            <td className="py-2 text-right">
              <RevokeToken token={token} />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
