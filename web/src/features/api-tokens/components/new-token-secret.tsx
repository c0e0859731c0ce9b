import { useState } from 'react';
import type { CreatedApiTokenDTO } from '@shared/api/tokens';
import { Button } from '@/components/button';

/**
 * The secret of a token just created, shown this once with a copy button. It lives only in this
 * component's props: leaving the page or pressing Done forgets it, and the server cannot show it again.
 */
export function NewTokenSecret({ created, onDone }: { created: CreatedApiTokenDTO; onDone: () => void }) {
  const [copied, setCopied] = useState<'yes' | 'failed'>();
  const copy = () =>
    navigator.clipboard.writeText(created.token).then(
      () => setCopied('yes'),
      () => setCopied('failed'),
    );
  return (
    <div className="space-y-3">
      {/* Ink on the amber ground: the warning tone's amber text is too faint for a message this important. */}
      <p className="rounded-sm border border-amber/40 bg-amber-soft px-3 py-2 text-sm text-ink">
        <strong>Copy this token now. It will not be shown again:</strong> Doublet keeps only a hash of it. If you lose it, revoke it and
        create a new one.
      </p>
      <p className="text-sm">
        Token <span className="font-semibold">{created.apiToken.name}</span> for <span className="font-mono">{created.apiToken.repositoryName}</span>:
      </p>
      <div className="flex items-center gap-2">
        <code data-testid="new-token-secret" className="min-w-0 flex-1 rounded-sm border border-line bg-paper px-2 py-1.5 font-mono text-xs break-all select-all">
          {created.token}
        </code>
        <Button variant="secondary" onClick={copy}>
          Copy
        </Button>
      </div>
      {copied === 'yes' ? <p className="text-xs text-muted">Copied to the clipboard.</p> : null}
      {copied === 'failed' ? <p className="text-xs text-danger">The browser refused the clipboard: select the token and copy it by hand.</p> : null}
      <Button onClick={onDone}>Done, I have copied it</Button>
    </div>
  );
}
