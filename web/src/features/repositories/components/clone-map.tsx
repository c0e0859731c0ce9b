import type { MouseEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Treemap } from 'recharts';
import type { CloneMapDTO } from '@shared/api/repositories';
import { QueryState } from '@/components/data-state';
import { formatPercent } from '@/lib/format';
import { useCloneMap } from '@/features/repositories/api/get-clone-map';
import { cloneMapAreas, flattenAreas, SHARE_STEPS, shareStep, UNCLONED_FILL, type CloneMapArea } from '@/features/repositories/lib/clone-map';

/** Where a directory's classes are listed: the organisation's class list, narrowed to the repository and the directory. */
export function classesInDirectory(repositoryId: number, directory: string): string {
  const params = new URLSearchParams({ repository: String(repositoryId) });
  if (directory !== '') params.set('path', directory);
  return `/clone-classes?${params}`;
}

/** What recharts hands a rectangle: its place and size, and the fields of its area. */
type Drawn = Partial<CloneMapArea> & { x: number; y: number; width: number; height: number; depth: number };

/** The legend of the colour scale. */
function ShareLegend() {
  return (
    <ul className="flex flex-wrap items-center gap-x-3 gap-y-1 text-xs" aria-label="Shades: share of cloned tokens">
      <li className="flex items-center gap-1">
        <span aria-hidden="true" className="inline-block h-3 w-4 rounded-[1px] border border-line" style={{ background: UNCLONED_FILL }} />
        not cloned
      </li>
      {SHARE_STEPS.slice(1).map((s) => (
        <li key={s.label} className="flex items-center gap-1">
          <span aria-hidden="true" className="inline-block h-3 w-4 rounded-[1px] border border-line" style={{ background: s.fill }} />
          {s.label}
        </li>
      ))}
    </ul>
  );
}

/**
 * The latest snapshot's directories as nested rectangles: the area is the tokens, the colour the
 * share of them that is cloned. A click on a rectangle lists the classes in that directory. The
 * table under it says the same in text, with a link a directory, for keyboards and screen readers.
 */
export function CloneMapView({ map, height = 260 }: { map: CloneMapDTO; height?: number }) {
  const navigate = useNavigate();
  if (!map.root || !map.snapshot || map.root.tokens === 0) {
    return <p className="text-sm text-muted">No analysed code yet: the map appears with the first loaded release.</p>;
  }
  const areas = cloneMapAreas(map.root);
  const open = (directory: string) => navigate(classesInDirectory(map.repositoryId, directory));
  const drawArea = (props: Drawn) => {
    const { x, y, width, height: h, depth, name, directory, share, children } = props;
    // recharts draws every level; only the innermost rectangles are painted, the rest show as their outlines
    if (depth === 0 || name === undefined || directory === undefined) return <g />;
    const step = shareStep(share ?? 0);
    const isLeaf = !children || (children as unknown[]).length === 0;
    const onClick = (event: MouseEvent) => {
      event.stopPropagation();
      open(directory);
    };
    if (!isLeaf) {
      return (
        <g>
          <rect x={x} y={y} width={width} height={h} fill="none" stroke="#1f2523" strokeOpacity={0.5} strokeWidth={depth === 1 ? 2 : 1} />
        </g>
      );
    }
    // The cloned band rises from the bottom to the share of cloned tokens: its area is the cloned tokens.
    const band = h * Math.min(1, Math.max(0, share ?? 0));
    const labelOnBand = band > h - 16;
    return (
      <g data-directory={directory} onClick={onClick} style={{ cursor: 'pointer' }}>
        <title>{`${name}: ${formatPercent(share)} of ${props.tokens} tokens cloned`}</title>
        <rect x={x} y={y} width={width} height={h} fill={UNCLONED_FILL} />
        {band > 0 ? <rect data-cloned-band="" x={x} y={y + h - band} width={width} height={band} fill={step.fill} /> : null}
        <rect x={x} y={y} width={width} height={h} fill="none" stroke="#d9d6cc" strokeWidth={1} />
        {width > 48 && h > 16 ? (
          <text x={x + 4} y={y + 13} fill={labelOnBand ? step.ink : '#1f2523'} fontSize={11} fontFamily='"IBM Plex Mono", ui-monospace, monospace' pointerEvents="none">
            {name.length * 6.6 + 8 > width ? `${name.slice(0, Math.max(1, Math.floor((width - 8) / 6.6) - 1))}…` : name}
          </text>
        ) : null}
      </g>
    );
  };
  return (
    <figure aria-label={`Clone map of ${map.snapshot.label}`}>
      <div aria-hidden="true">
        <Treemap
          style={{ width: '100%', height }}
          data={areas as unknown as Record<string, unknown>[]}
          dataKey="tokens"
          nameKey="name"
          type="flat"
          isAnimationActive={false}
          content={drawArea as never}
        />
      </div>
      <figcaption className="mt-2 space-y-1 text-xs text-muted">
        <p>
          Each rectangle is a directory of {map.snapshot.label}, sized by its tokens. The band rising from its foot is the share of them in clone pairs
          (so the bands&apos; area is the cloned code), shaded darker the larger the share. Choose a rectangle to list its classes.
          {map.complete ? '' : ' The deepest directories are folded into their parents.'}
        </p>
        <ShareLegend />
      </figcaption>
      <details className="mt-1 text-xs">
        <summary className="cursor-pointer text-accent-strong focus-visible:outline-2 focus-visible:outline-accent">Directories as a table</summary>
        <table className="mt-1 w-full font-mono" aria-label="Clone map, as a table">
          <thead>
            <tr className="text-left text-muted">
              <th className="pr-4 font-semibold">Directory</th>
              <th className="pr-4 text-right font-semibold">Tokens</th>
              <th className="pr-4 text-right font-semibold">Cloned</th>
              <th className="text-right font-semibold">Share</th>
            </tr>
          </thead>
          <tbody>
            {flattenAreas(areas).map((a) => (
              <tr key={`${a.name}-${a.depth}`}>
                <td className="pr-4" style={{ paddingLeft: `${a.depth}rem` }}>
                  <Link to={classesInDirectory(map.repositoryId, a.directory)} className="text-accent-strong hover:underline">
                    {a.name}
                  </Link>
                </td>
                <td className="pr-4 text-right tabular-nums">{a.tokens}</td>
                <td className="pr-4 text-right tabular-nums">{a.clonedTokens}</td>
                <td className="text-right tabular-nums">{formatPercent(a.share)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}

/** A repository's clone map, loaded. */
export function CloneMap({ repositoryId, height }: { repositoryId: number; height?: number }) {
  const map = useCloneMap(repositoryId);
  if (!map.data) return <QueryState query={map} what="the clone map" />;
  return <CloneMapView map={map.data} height={height} />;
}
