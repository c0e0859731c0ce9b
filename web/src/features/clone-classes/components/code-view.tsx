/**
 * Source lines with their numbers in the file, in IBM Plex Mono. Plain text for now; the gutter is
 * a separate column so that selecting code does not pick up the numbers.
 */
export function CodeView({ code, startLine, label }: { code: string; startLine: number; label: string }) {
  const lines = code.split('\n');
  const width = String(startLine + lines.length - 1).length;
  return (
    <div className="max-h-[32rem] overflow-auto border-t border-line bg-white" role="region" aria-label={label} tabIndex={0}>
      <div className="flex min-w-max font-mono text-[12.5px] leading-5">
        <div aria-hidden="true" className="sticky left-0 border-r border-line bg-paper px-2 text-right text-muted/80 select-none">
          {lines.map((_, i) => (
            <div key={i} style={{ minWidth: `${width}ch` }}>
              {startLine + i}
            </div>
          ))}
        </div>
        <pre className="m-0 flex-1 px-3 whitespace-pre text-ink">
          <code>{code}</code>
        </pre>
      </div>
    </div>
  );
}
