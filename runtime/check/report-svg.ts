// Check report as SVG and as a self-contained HTML page: expected and measured pitch per source over time,
// a pass/fail badge and error figures per source, and the time scale plotted beneath on the same time axis.
import type { Cents, Hz, Seconds } from '../../src/index';
import type { PitchErrorStats } from '../../src/analysis';
import { ratioToCents } from '../../src/dsp';

/** One checked source as the report shows it. */
export interface ReportSource {
  /** Source (or voice) name shown in the panel title. */
  name: string;
  /** Frame times in seconds (increasing). */
  times: ArrayLike<Seconds>;
  /** Expected heard frequency per frame in Hz (NaN = none). */
  expectedHz: ArrayLike<Hz>;
  /** Expected frequency on the frames the verdict judged, NaN elsewhere (optional; drawn over the expected curve). */
  judgedHz?: ArrayLike<Hz>;
  /** Measured frequency per frame in Hz (NaN = no pitch found). */
  measuredHz: ArrayLike<Hz>;
  /** Error figures over the frames where both are present. */
  stats: PitchErrorStats;
  /** Verdict against the tolerance. */
  passed: boolean;
  /** Reference for the cents scale (default: the median expected frequency). */
  referenceHz?: Hz;
  /** Extra line under the figures, e.g. why the source failed. */
  note?: string;
}

/** The whole report. */
export interface CheckReport {
  /** Title, e.g. the scene script's file name. */
  title: string;
  /** Tolerance in cents that the verdicts used. */
  toleranceCents: Cents;
  sources: readonly ReportSource[];
  /** Time scale over the same times (optional; the strip is left out without it). */
  timeScale?: { times: ArrayLike<Seconds>; values: ArrayLike<number> };
}

/** Options of the SVG rendering. */
export interface ReportSvgOptions {
  /** Total width in px, 480…4000 (default 960). */
  width?: number;
  /** Pitch axis: 'hz' or 'cents' relative to each source's reference (default 'hz'). */
  unit?: 'hz' | 'cents';
}

/** Frozen defaults of ReportSvgOptions. */
export const reportSvgDefaults = Object.freeze({ width: 960, unit: 'hz' as 'hz' | 'cents' });

const colours = Object.freeze({
  ink: '#222222',
  grid: '#e4e4e4',
  axis: '#888888',
  expected: '#c2c2c2',
  judged: '#222222',
  measured: '#1f6fd1',
  timeScale: '#a05a00',
  pass: '#2e7d32',
  fail: '#c62828',
});
const margin = Object.freeze({ left: 70, right: 24, top: 44, bottom: 30 });
const PANEL_HEIGHT = 230;
const STRIP_HEIGHT = 130;
const HEADER_HEIGHT = 56;

/** Escapes text for XML content and attribute values. */
export function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c]!);
}

function fmt(v: number): string {
  return Number.isFinite(v) ? (Math.round(v * 10) / 10).toString() : '0';
}

function figure(v: number, digits = 2): string {
  return Number.isFinite(v) ? v.toFixed(digits) : '–';
}

/** Tick values covering [lo, hi] at a 1-2-5 step, about `count` of them. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const ticks: number[] = [];
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + step * 1e-9; k++) ticks.push(k === 0 ? 0 : Number((k * step).toPrecision(12)));
  return ticks;
}

function range(values: ArrayLike<number>[], pad: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const arr of values) {
    for (let i = 0; i < arr.length; i++) {
      const v = arr[i];
      if (Number.isFinite(v)) {
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
  }
  if (!(hi >= lo)) return [0, 1];
  if (hi - lo < pad) {
    const mid = (hi + lo) / 2;
    return [mid - pad / 2, mid + pad / 2];
  }
  const extra = (hi - lo) * 0.06;
  return [lo - extra, hi + extra];
}

/** SVG path data through the finite points; a gap (NaN) starts a new sub-path. */
export function pathData(xs: ArrayLike<number>, ys: ArrayLike<number>, x: (v: number) => number, y: (v: number) => number): string {
  const parts: string[] = [];
  let pen = false;
  for (let i = 0; i < xs.length; i++) {
    const vx = xs[i];
    const vy = ys[i];
    if (!Number.isFinite(vx) || !Number.isFinite(vy)) {
      pen = false;
      continue;
    }
    parts.push(`${pen ? 'L' : 'M'}${fmt(x(vx))} ${fmt(y(vy))}`);
    pen = true;
  }
  return parts.join('');
}

function median(values: ArrayLike<number>): number {
  const finite = Array.from(values).filter((v) => Number.isFinite(v) && v > 0).sort((a, b) => a - b);
  return finite.length > 0 ? finite[Math.floor(finite.length / 2)] : 1;
}

interface Frame {
  top: number;
  height: number;
  width: number;
  t0: number;
  t1: number;
}

function timeAxis(f: Frame, out: string[]): (t: number) => number {
  const plotW = f.width - margin.left - margin.right;
  const x = (t: number) => margin.left + ((t - f.t0) / (f.t1 - f.t0 || 1)) * plotW;
  const bottom = f.top + f.height - margin.bottom;
  for (const t of niceTicks(f.t0, f.t1, 8)) {
    out.push(`<line x1="${fmt(x(t))}" y1="${fmt(f.top + margin.top)}" x2="${fmt(x(t))}" y2="${fmt(bottom)}" stroke="${colours.grid}"/>`);
    out.push(`<text x="${fmt(x(t))}" y="${fmt(bottom + 16)}" text-anchor="middle">${escapeXml(figure(t, t % 1 === 0 ? 0 : 1))}</text>`);
  }
  return x;
}

function valueAxis(f: Frame, lo: number, hi: number, label: string, out: string[]): (v: number) => number {
  const top = f.top + margin.top;
  const bottom = f.top + f.height - margin.bottom;
  const y = (v: number) => bottom - ((v - lo) / (hi - lo || 1)) * (bottom - top);
  const ticks = niceTicks(lo, hi, 5);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
  const digits = step >= 1 ? 0 : Math.min(3, Math.ceil(-Math.log10(step)));
  for (const v of ticks) {
    out.push(`<line x1="${margin.left}" y1="${fmt(y(v))}" x2="${fmt(f.width - margin.right)}" y2="${fmt(y(v))}" stroke="${colours.grid}"/>`);
    out.push(`<text x="${margin.left - 6}" y="${fmt(y(v) + 4)}" text-anchor="end">${escapeXml(v.toFixed(digits))}</text>`);
  }
  out.push(`<rect x="${margin.left}" y="${fmt(top)}" width="${fmt(f.width - margin.left - margin.right)}" height="${fmt(bottom - top)}" fill="none" stroke="${colours.axis}"/>`);
  out.push(`<text transform="translate(16 ${fmt((top + bottom) / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(label)}</text>`);
  return y;
}

function sourcePanel(s: ReportSource, f: Frame, unit: 'hz' | 'cents', tolerance: Cents, out: string[]): void {
  const ref = s.referenceHz ?? median(s.expectedHz);
  const toUnit = (hz: ArrayLike<number>) =>
    unit === 'hz' ? hz : Float64Array.from(hz as ArrayLike<number>, (v) => (v > 0 ? ratioToCents(v / ref) : NaN));
  const expected = toUnit(s.expectedHz);
  const measured = toUnit(s.measuredHz);
  const [lo, hi] = range([expected, measured], unit === 'hz' ? Math.max(1, ref * 0.01) : 20);
  out.push(`<g class="source" data-source="${escapeXml(s.name)}">`);
  const label = unit === 'hz' ? 'pitch (Hz)' : `pitch (cents re ${figure(ref, 1)} Hz)`;
  const y = valueAxis(f, lo, hi, label, out);
  const x = timeAxis(f, out);
  const clip = (v: number) => Math.min(hi, Math.max(lo, v));
  out.push(`<path data-series="expected" d="${pathData(s.times, expected, x, (v) => y(clip(v)))}" fill="none" stroke="${colours.expected}" stroke-width="4" stroke-linejoin="round"/>`);
  if (s.judgedHz) out.push(`<path data-series="judged" d="${pathData(s.times, toUnit(s.judgedHz), x, (v) => y(clip(v)))}" fill="none" stroke="${colours.judged}" stroke-width="1.2"/>`);
  out.push(`<path data-series="measured" d="${pathData(s.times, measured, x, (v) => y(clip(v)))}" fill="none" stroke="${colours.measured}" stroke-width="1.2" stroke-dasharray="5 3"/>`);
  const verdict = s.passed ? 'PASS' : 'FAIL';
  const badgeX = f.width - margin.right - 64;
  out.push(`<g class="badge" data-verdict="${verdict.toLowerCase()}"><rect x="${badgeX}" y="${f.top + 8}" width="64" height="24" rx="4" fill="${s.passed ? colours.pass : colours.fail}"/>`);
  out.push(`<text x="${badgeX + 32}" y="${f.top + 25}" text-anchor="middle" fill="#ffffff" font-weight="bold">${verdict}</text></g>`);
  const st = s.stats;
  const line = `median ${figure(st.medianCents)} ¢ · 95th percentile ${figure(st.p95Cents)} ¢ · max ${figure(st.maxCents)} ¢ (tolerance ${figure(tolerance, 1)} ¢) · ${st.count} frames, ${st.excluded} without pitch`;
  out.push(`<text x="${margin.left}" y="${f.top + 18}" font-weight="bold">${escapeXml(s.name)}</text>`);
  out.push(`<text x="${margin.left}" y="${f.top + 35}" fill="#555555">${escapeXml(line + (s.note ? ` · ${s.note}` : ''))}</text>`);
  out.push('</g>');
}

/** Renders the report as one standalone SVG document (UTF-8 text). */
export function renderReportSvg(report: CheckReport, options: ReportSvgOptions = {}): string {
  const width = Math.min(4000, Math.max(480, options.width ?? reportSvgDefaults.width));
  const unit = options.unit ?? reportSvgDefaults.unit;
  let t0 = Infinity;
  let t1 = -Infinity;
  const timeArrays = report.sources.map((s) => s.times).concat(report.timeScale ? [report.timeScale.times] : []);
  for (const ts of timeArrays) {
    for (let i = 0; i < ts.length; i++) {
      if (ts[i] < t0) t0 = ts[i];
      if (ts[i] > t1) t1 = ts[i];
    }
  }
  if (!(t1 > t0)) [t0, t1] = [0, 1];
  const height = HEADER_HEIGHT + report.sources.length * PANEL_HEIGHT + (report.timeScale ? STRIP_HEIGHT : 0) + 10;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="system-ui, sans-serif" font-size="12" fill="${colours.ink}">`);
  out.push(`<title>${escapeXml(report.title)}</title>`);
  out.push(`<rect width="${width}" height="${height}" fill="#ffffff"/>`);
  const failed = report.sources.filter((s) => !s.passed).length;
  const summary = `${report.sources.length - failed} of ${report.sources.length} sources within ${figure(report.toleranceCents, 1)} cents`;
  out.push(`<text x="${margin.left}" y="24" font-size="16" font-weight="bold">${escapeXml(report.title)}</text>`);
  out.push(`<text x="${margin.left}" y="44" fill="#555555">${escapeXml(summary)} — grey: expected, black: expected where judged, dashed blue: measured</text>`);
  report.sources.forEach((s, i) => sourcePanel(s, { top: HEADER_HEIGHT + i * PANEL_HEIGHT, height: PANEL_HEIGHT, width, t0, t1 }, unit, report.toleranceCents, out));
  if (report.timeScale) {
    const f = { top: HEADER_HEIGHT + report.sources.length * PANEL_HEIGHT, height: STRIP_HEIGHT, width, t0, t1 };
    const [, top] = range([report.timeScale.values], 0);
    out.push('<g class="time-scale">');
    const y = valueAxis({ ...f, top: f.top - 20 }, 0, Math.max(1, top), 'time scale', out);
    const x = timeAxis({ ...f, top: f.top - 20 }, out);
    out.push(`<path data-series="time-scale" d="${pathData(report.timeScale.times, report.timeScale.values, x, y)}" fill="none" stroke="${colours.timeScale}" stroke-width="1.6"/>`);
    out.push(`<text x="${fmt(width / 2)}" y="${height - 2}" text-anchor="middle">time (s)</text>`);
    out.push('</g>');
  }
  out.push('</svg>');
  return out.join('\n');
}

/** Renders the report as a self-contained HTML page: a figures table and the SVG inline (no external files). */
export function renderReportHtml(report: CheckReport, options: ReportSvgOptions = {}): string {
  const rows = report.sources
    .map((s) => {
      const st = s.stats;
      const verdict = s.passed ? 'pass' : 'fail';
      return `<tr><td>${escapeXml(s.name)}</td><td class="${verdict}">${verdict.toUpperCase()}</td><td>${figure(st.medianCents)}</td><td>${figure(st.p95Cents)}</td><td>${figure(st.maxCents)}</td><td>${st.count}</td><td>${st.excluded}</td><td>${escapeXml(s.note ?? '')}</td></tr>`;
    })
    .join('\n');
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>${escapeXml(report.title)}</title>
<style>
body { font-family: system-ui, sans-serif; color: #222; background: #fff; margin: 24px; }
table { border-collapse: collapse; margin: 12px 0 20px; }
th, td { border-bottom: 1px solid #ddd; padding: 4px 10px; text-align: right; }
th:first-child, td:first-child, td:last-child { text-align: left; }
td.pass { color: ${colours.pass}; font-weight: bold; }
td.fail { color: ${colours.fail}; font-weight: bold; }
</style>
</head>
<body>
<h1>${escapeXml(report.title)}</h1>
<p>Pitch error against the expected heard frequency, tolerance ${figure(report.toleranceCents, 1)} cents.</p>
<table>
<thead><tr><th>source</th><th>verdict</th><th>median ¢</th><th>95th percentile ¢</th><th>max ¢</th><th>frames</th><th>without pitch</th><th>note</th></tr></thead>
<tbody>
${rows}
</tbody>
</table>
${renderReportSvg(report, options)}
</body>
</html>
`;
}
