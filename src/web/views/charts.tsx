/**
 * Server-rendered SVG of the chart geometry in domain/estimate-charts.ts. Each picture has a
 * <title> and <desc> (its text alternative), uses only our stylesheet's classes and prints.
 */
import type { Chart, IntervalPicture } from '../../domain/estimate-charts.js';

const W = 420;
const H = 260;
const STRIP_H = 96;
const M = { left: 64, right: 14, top: 10, bottom: 40 };

function tickLabel(v: number): string {
  const a = Math.abs(v);
  if (a >= 1e6) return `${+(v / 1e6).toFixed(2)}M`;
  if (a >= 1e4) return `${+(v / 1e3).toFixed(1)}k`;
  return Number.isInteger(v) ? v.toLocaleString('en-US') : String(+v.toFixed(3));
}

/** One decimal is finer than a screen pixel at any size the page shows. */
const r1 = (v: number) => Math.round(v * 10) / 10;

function scale(min: number, max: number, from: number, to: number) {
  return (v: number) => from + ((v - min) / (max - min || 1)) * (to - from);
}

export function ChartSvg(props: { chart: Chart }) {
  const c = props.chart;
  const strip = c.y === undefined;
  const height = strip ? STRIP_H : H;
  const sx = scale(c.x.min, c.x.max, M.left, W - M.right);
  const plotBottom = height - M.bottom;
  const sy = c.y ? scale(c.y.min, c.y.max, plotBottom, M.top) : () => (M.top + plotBottom) / 2;
  const titleId = `${c.id}-title`;
  const descId = `${c.id}-desc`;
  return (
    <figure class="chart">
      <svg viewBox={`0 0 ${W} ${height}`} role="img" aria-labelledby={`${titleId} ${descId}`} class={strip ? 'strip' : 'scatter'}>
        <title id={titleId}>{c.title}</title>
        <desc id={descId}>{c.description}</desc>
        <rect class="plot-area" x={M.left} y={M.top} width={W - M.left - M.right} height={plotBottom - M.top} />
        {c.x.ticks.map((t) => (
          <g class="tick">
            <line x1={sx(t)} x2={sx(t)} y1={plotBottom} y2={plotBottom + 4} />
            <text x={sx(t)} y={plotBottom + 15} text-anchor="middle">
              {tickLabel(t)}
            </text>
          </g>
        ))}
        <text class="axis-label" x={(M.left + W - M.right) / 2} y={height - 6} text-anchor="middle">
          {c.x.label}
        </text>
        {c.y
          ? c.y.ticks.map((t) => (
              <g class="tick">
                <line x1={M.left - 4} x2={M.left} y1={sy(t)} y2={sy(t)} />
                <line class="grid-line" x1={M.left} x2={W - M.right} y1={sy(t)} y2={sy(t)} />
                <text x={M.left - 7} y={sy(t) + 4} text-anchor="end">
                  {tickLabel(t)}
                </text>
              </g>
            ))
          : null}
        {c.y ? (
          <text class="axis-label" transform={`translate(12 ${(M.top + plotBottom) / 2}) rotate(-90)`} text-anchor="middle">
            {c.y.label}
          </text>
        ) : null}
        {c.referenceY !== undefined && c.y ? <line class="reference" x1={M.left} x2={W - M.right} y1={sy(c.referenceY)} y2={sy(c.referenceY)} /> : null}
        {/* All points of a kind in one path (a zero-length stroke per point with round caps):
            one element instead of hundreds keeps big markets' pages small and fast. */}
        {strip ? (
          <path class="strip-marks" d={c.points.map((p) => `M${r1(sx(p.x))} ${M.top + 14}V${plotBottom - 14}`).join('')} />
        ) : (
          <>
            <path class="points" d={c.points.filter((p) => !p.flagged).map((p) => `M${r1(sx(p.x))} ${r1(sy(p.y))}h0`).join('')} />
            <path class="points flagged" d={c.points.filter((p) => p.flagged).map((p) => `M${r1(sx(p.x))} ${r1(sy(p.y))}h0`).join('')} />
          </>
        )}
        {c.points
          .filter((p) => p.label)
          .map((p) => (
            <text class="point-label" x={sx(p.x) > W - 70 ? sx(p.x) - 5 : sx(p.x) + 5} y={sy(p.y) - 5} text-anchor={sx(p.x) > W - 70 ? 'end' : 'start'}>
              {p.label}
            </text>
          ))}
        {c.subject ? (
          <g class={c.subject.outside ? 'subject outside' : 'subject'}>
            <path
              d={`M ${sx(c.subject.x)} ${(c.subject.y !== undefined ? sy(c.subject.y) : sy(0)) - 7} l 7 7 l -7 7 l -7 -7 z`}
            />
            <text x={sx(c.subject.x)} y={M.top + 10} text-anchor="middle">
              subject
            </text>
          </g>
        ) : null}
      </svg>
      <figcaption>{c.title}</figcaption>
    </figure>
  );
}

export function IntervalSvg(props: { picture: IntervalPicture; format: (v: number) => string }) {
  const p = props.picture;
  const height = 110;
  const sx = scale(p.axis.min, p.axis.max, M.left, W - M.right);
  return (
    <figure class="chart interval-chart">
      <svg viewBox={`0 0 ${W} ${height}`} role="img" aria-labelledby="interval-title interval-desc">
        <title id="interval-title">{p.title}</title>
        <desc id="interval-desc">{p.description}</desc>
        {p.axis.ticks.map((t) => (
          <g class="tick">
            <line x1={sx(t)} x2={sx(t)} y1={80} y2={84} />
            <text x={sx(t)} y={96} text-anchor="middle">
              {tickLabel(t)}
            </text>
          </g>
        ))}
        <line class="axis" x1={M.left} x2={W - M.right} y1={80} y2={80} />
        <rect class="band prediction" x={sx(p.prediction[0])} y={30} width={sx(p.prediction[1]) - sx(p.prediction[0])} height={22} />
        <rect class="band confidence" x={sx(p.confidence[0])} y={34} width={Math.max(1, sx(p.confidence[1]) - sx(p.confidence[0]))} height={14} />
        <line class="value-mark" x1={sx(p.value)} x2={sx(p.value)} y1={22} y2={60} />
        <text class="band-label" x={M.left} y={16}>
          {`${p.levelPercent} % prediction ${props.format(p.prediction[0])} – ${props.format(p.prediction[1])}`}
        </text>
        <text class="band-label" x={M.left} y={72}>
          {`${p.levelPercent} % confidence ${props.format(p.confidence[0])} – ${props.format(p.confidence[1])}`}
        </text>
      </svg>
      <figcaption>{p.title}</figcaption>
    </figure>
  );
}
