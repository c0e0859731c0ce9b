import { CartesianGrid, Line, LineChart, Tooltip, XAxis, YAxis } from 'recharts';
import type { OrganisationTrendDTO } from '@shared/api/organisation';
import { formatDateTime, formatPercent } from '@/lib/format';

// The palette of index.css, spelled out because SVG attributes take no Tailwind classes.
const INK = '#1f2523';
const GRID = '#e4e1d8';
const MUTED = '#646d67';
const TICK = { fill: MUTED, fontSize: 11, fontFamily: '"IBM Plex Mono", ui-monospace, monospace' };

/**
 * The organisation's clone ratio after each load: the cloned tokens of every repository's latest
 * release over all their tokens, so a large repository weighs more than a small one. A step-shaped
 * line, since the figure holds until the next load; with its figures as a table for those who
 * cannot see the chart.
 */
export function OrganisationTrendChart({ trend, height = 200 }: { trend: OrganisationTrendDTO; height?: number }) {
  if (trend.points.length === 0) {
    return <p className="text-sm text-muted">No release loaded yet: the trend starts with the first one.</p>;
  }
  const data = trend.points.map((p) => ({ ratio: p.cloneRatio * 100, load: `${p.repositoryName}@${p.label}` }));
  const top = Math.max(...data.map((d) => d.ratio));
  const step = top <= 4 ? 1 : top <= 10 ? 2 : top <= 25 ? 5 : 10;
  const domainTop = Math.min(100, Math.max(step, Math.ceil((top * 1.15) / step) * step));
  const ticks = Array.from({ length: domainTop / step + 1 }, (_, i) => i * step);
  const latest = trend.points[trend.points.length - 1];
  return (
    <figure aria-label="Clone ratio across all repositories" data-points={data.length}>
      <LineChart responsive style={{ width: '100%', height }} data={data} margin={{ top: 8, right: 16, bottom: 0, left: 0 }}>
        <CartesianGrid stroke={GRID} vertical={false} />
        <XAxis dataKey="load" tick={TICK} tickLine={false} axisLine={{ stroke: GRID }} interval="preserveStartEnd" minTickGap={24} padding={{ left: 48, right: 48 }} />
        <YAxis domain={[0, domainTop]} ticks={ticks} interval={0} tick={TICK} tickLine={false} axisLine={false} width={44} tickFormatter={(v: number) => `${v} %`} />
        <Tooltip
          isAnimationActive={false}
          labelFormatter={(load) => `after ${load}`}
          formatter={(value) => [formatPercent(Number(value) / 100), 'all repositories']}
          contentStyle={{ fontSize: 12, borderRadius: 2, borderColor: '#d9d6cc' }}
        />
        <Line type="stepAfter" dataKey="ratio" stroke={INK} strokeWidth={2} dot={{ r: 2.5, fill: INK }} isAnimationActive={false} />
      </LineChart>
      <figcaption className="mt-1 text-xs text-muted">
        After each load, the share of all repositories&apos; tokens inside clone pairs, each repository counted with its latest release. Now{' '}
        {formatPercent(latest.cloneRatio)} over {latest.repositoryCount} {latest.repositoryCount === 1 ? 'repository' : 'repositories'}.
      </figcaption>
      <details className="mt-1 text-xs">
        <summary className="cursor-pointer text-accent-strong focus-visible:outline-2 focus-visible:outline-accent">Figures as a table</summary>
        <table className="mt-1 font-mono" aria-label="Clone ratio across all repositories, as a table">
          <thead>
            <tr className="text-left text-muted">
              <th className="pr-4 font-semibold">Load</th>
              <th className="pr-4 font-semibold">Release</th>
              <th className="pr-4 font-semibold">Loaded</th>
              <th className="pr-4 text-right font-semibold">Repositories</th>
              <th className="text-right font-semibold">Clone ratio</th>
            </tr>
          </thead>
          <tbody>
            {trend.points.map((p, i) => (
              <tr key={p.snapshotId}>
                <td className="pr-4 tabular-nums">{i + 1}</td>
                <td className="pr-4">
                  {p.repositoryName}@{p.label}
                </td>
                <td className="pr-4">{formatDateTime(p.createdAt)}</td>
                <td className="pr-4 text-right tabular-nums">{p.repositoryCount}</td>
                <td className="text-right tabular-nums">{formatPercent(p.cloneRatio)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}
