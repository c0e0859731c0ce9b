import { CartesianGrid, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import type { RepositoryMetricsDTO } from '@shared/api/repositories';
import { QueryState } from '@/components/data-state';
import { formatPercent } from '@/lib/format';
import { useRepositoryMetrics } from '@/features/repositories/api/get-repository-metrics';

// The palette of index.css, spelled out because SVG attributes take no Tailwind classes.
const ACCENT = '#2d6e60';
const BUDGET = '#a2392b';
const GRID = '#e4e1d8';
const MUTED = '#646d67';
const TICK = { fill: MUTED, fontSize: 11, fontFamily: '"IBM Plex Mono", ui-monospace, monospace' };

/**
 * The clone ratio over releases (percent), with the budget as a dashed line when there is one.
 * Drawn without animation so that what is on screen is the data, at once (screenshots included).
 */
export function TrendChartView({ metrics, height = 220 }: { metrics: RepositoryMetricsDTO; height?: number }) {
  if (metrics.points.length === 0) {
    return <p className="text-sm text-muted">No ready snapshot yet: the trend starts with the first loaded release.</p>;
  }
  const data = metrics.points.map((p) => ({ label: p.label, ratio: p.cloneRatio * 100 }));
  const budget = metrics.cloneBudget === null ? null : metrics.cloneBudget * 100;
  const top = Math.max(budget ?? 0, ...data.map((d) => d.ratio));
  // Headroom above the highest of line and budget, up to a round step, so the ticks read 0, 10, 20 …
  const step = top <= 4 ? 1 : top <= 10 ? 2 : top <= 25 ? 5 : 10;
  const domainTop = Math.min(100, Math.max(step, Math.ceil((top * 1.15) / step) * step));
  const ticks = Array.from({ length: domainTop / step + 1 }, (_, i) => i * step);
  return (
    <figure aria-label="Clone ratio by release" data-points={data.length}>
      <LineChart responsive style={{ width: '100%', height }} data={data} margin={{ top: 8, right: budget !== null ? 96 : 16, bottom: 0, left: 0 }}>
        <CartesianGrid stroke={GRID} vertical={false} />
        <XAxis dataKey="label" tick={TICK} tickLine={false} axisLine={{ stroke: GRID }} />
        <YAxis
          domain={[0, domainTop]}
          ticks={ticks}
          interval={0}
          tick={TICK}
          tickLine={false}
          axisLine={false}
          width={44}
          tickFormatter={(v: number) => `${v} %`}
        />
        <Tooltip
          isAnimationActive={false}
          formatter={(value) => [formatPercent(Number(value) / 100), 'clone ratio']}
          contentStyle={{ fontSize: 12, borderRadius: 2, borderColor: '#d9d6cc' }}
        />
        {budget !== null ? (
          <ReferenceLine
            y={budget}
            stroke={BUDGET}
            strokeDasharray="5 4"
            ifOverflow="extendDomain"
            label={{ value: `budget ${formatPercent(metrics.cloneBudget)}`, position: 'right', fill: BUDGET, fontSize: 11 }}
          />
        ) : null}
        <Line type="linear" dataKey="ratio" stroke={ACCENT} strokeWidth={2} dot={{ r: 3, fill: ACCENT }} isAnimationActive={false} />
      </LineChart>
      <figcaption className="mt-1 text-xs text-muted">
        Share of fragment tokens inside at least one clone pair, per release{budget !== null ? '; dashed: the clone budget' : ''}.
      </figcaption>
      {/* The chart's text alternative: the same figures, readable without the picture. */}
      <details className="mt-1 text-xs">
        <summary className="cursor-pointer text-accent-strong focus-visible:outline-2 focus-visible:outline-accent">Figures as a table</summary>
        <table className="mt-1 font-mono" aria-label="Clone ratio by release, as a table">
          <thead>
            <tr className="text-left text-muted">
              <th className="pr-4 font-semibold">Release</th>
              <th className="pr-4 text-right font-semibold">Clone ratio</th>
              <th className="text-right font-semibold">Classes</th>
            </tr>
          </thead>
          <tbody>
            {metrics.points.map((p) => (
              <tr key={p.snapshotId}>
                <td className="pr-4">{p.label}</td>
                <td className="pr-4 text-right tabular-nums">{formatPercent(p.cloneRatio)}</td>
                <td className="text-right tabular-nums">{p.classCount}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {budget !== null ? <p className="mt-1 text-muted">Clone budget: {formatPercent(metrics.cloneBudget)}.</p> : null}
      </details>
    </figure>
  );
}

/** A repository's trend, loaded. */
export function TrendChart({ repositoryId, height }: { repositoryId: number; height?: number }) {
  const metrics = useRepositoryMetrics(repositoryId);
  if (!metrics.data) return <QueryState query={metrics} what="the trend" />;
  return <TrendChartView metrics={metrics.data} height={height} />;
}
