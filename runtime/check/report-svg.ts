// Check report as SVG and as a self-contained HTML page, per source: expected and heard pitch over time, the error
// band (expected ± the p95 limit), judged and unjudged spans shaded by reason, the closest-approach mark, a verdict
// badge with the figures, and the time scale plotted beneath on the same time axis.
import type { Seconds } from '../../src/index';
import { centsToRatio } from '../../src/dsp';
import type { CheckLimits, SourceFigures, UnjudgedSpan } from './judge/judge-source';

/** One checked source as the report shows it (a CheckedSource fits). */
export interface ReportSource {
  /** Source (or voice) name shown in the panel title. */
  name: string;
  /** Frame times in seconds (increasing). */
  times: ArrayLike<Seconds>;
  /** Expected heard frequency per frame in Hz (NaN = not heard). */
  expectedHz: ArrayLike<number>;
  /** Heard (tracked) frequency per frame in Hz (NaN = no pitch found). */
  heardHz: ArrayLike<number>;
  /** Signed error per frame in cents on judged frames, NaN elsewhere (optional; drawn in a strip under the pitch). */
  errorCents?: ArrayLike<number>;
  /** Unjudged spans of the sounding source, with their reasons. */
  unjudged: readonly UnjudgedSpan[];
  figures: SourceFigures;
  /** Reception time of closest approach, s, or null. */
  closestApproach: number | null;
  /** Doppler model of the expectation. */
  model?: string;
  passed: boolean;
  /** Why it failed (each names the source and a time). */
  failures: readonly string[];
}

/** The whole report. */
export interface CheckReport {
  /** Title, e.g. the scene script's file name. */
  title: string;
  /** What was judged: the audio the browser played, or an offline re-render. */
  mode: 'recorded-audio' | 're-render';
  /** Limits the verdicts used. */
  limits: CheckLimits;
  sources: readonly ReportSource[];
  /** Time scale over the same times (optional; the strip is left out without it). */
  timeScale?: { times: ArrayLike<Seconds>; values: ArrayLike<number> };
}

/** Options of the SVG rendering. */
export interface ReportSvgOptions {
  /** Total width in px, 480…4000 (default 960). */
  width?: number;
}

/** Frozen defaults of ReportSvgOptions. */
export const reportSvgDefaults = Object.freeze({ width: 960 });

const colours = Object.freeze({
  ink: '#222222',
  grid: '#e4e4e4',
  axis: '#888888',
  expected: '#222222',
  band: '#d9d9d9',
  heard: '#1f6fd1',
  closest: '#7b1fa2',
  unvoiced: '#fff1c2',
  level: '#e6e6e6',
  overlap: '#f6d0d0',
  range: '#d7e8f7',
  'path-step': '#e3d7f2',
  timeScale: '#a05a00',
  pass: '#2e7d32',
  fail: '#c62828',
});
const margin = Object.freeze({ left: 70, right: 24, top: 62, bottom: 30 });
const PANEL_HEIGHT = 260;
const ERROR_HEIGHT = 120;
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

const REASON_TEXT: Readonly<Record<string, string>> = Object.freeze({ unvoiced: 'unvoiced', level: 'too quiet', overlap: 'overlap with another source', range: 'outside the tracker range', 'path-step': 'step in the recorded path' });

function sourcePanel(s: ReportSource, f: Frame, limits: CheckLimits, out: string[]): void {
  const bandHi = Array.from(s.expectedHz as ArrayLike<number>, (v) => v * centsToRatio(limits.p95Cents));
  const bandLo = Array.from(s.expectedHz as ArrayLike<number>, (v) => v * centsToRatio(-limits.p95Cents));
  const [lo, hi] = range([s.expectedHz, s.heardHz], Math.max(1, median(s.expectedHz) * 0.01));
  out.push(`<g class="source" data-source="${escapeXml(s.name)}">`);
  const y = valueAxis(f, lo, hi, 'pitch (Hz)', out);
  const x = timeAxis(f, out);
  const top = f.top + margin.top;
  const bottom = f.top + f.height - margin.bottom;
  for (const u of s.unjudged) {
    const x0 = x(u.from - 0.005);
    const x1 = x(u.to + 0.005);
    out.push(`<rect class="unjudged" data-reason="${u.reason}" x="${fmt(x0)}" y="${fmt(top)}" width="${fmt(Math.max(1, x1 - x0))}" height="${fmt(bottom - top)}" fill="${colours[u.reason as keyof typeof colours] ?? colours.level}"><title>${escapeXml(`${REASON_TEXT[u.reason] ?? u.reason} ${figure(u.from)}–${figure(u.to)} s`)}</title></rect>`);
  }
  const clip = (v: number) => Math.min(hi, Math.max(lo, v));
  const upper = pathData(s.times, bandHi, x, (v) => y(clip(v)));
  const lower = pathData(s.times, bandLo, x, (v) => y(clip(v)));
  out.push(`<path data-series="band" d="${upper}${lower}" fill="none" stroke="${colours.band}" stroke-width="5" stroke-linejoin="round" opacity="0.9"/>`);
  out.push(`<path data-series="expected" d="${pathData(s.times, s.expectedHz, x, (v) => y(clip(v)))}" fill="none" stroke="${colours.expected}" stroke-width="1.2"/>`);
  out.push(`<path data-series="heard" d="${pathData(s.times, s.heardHz, x, (v) => y(clip(v)))}" fill="none" stroke="${colours.heard}" stroke-width="1.4" stroke-dasharray="5 3"/>`);
  if (s.closestApproach !== null && s.closestApproach >= f.t0 && s.closestApproach <= f.t1) {
    const cx = fmt(x(s.closestApproach));
    out.push(`<g class="closest-approach"><line x1="${cx}" y1="${fmt(top)}" x2="${cx}" y2="${fmt(bottom)}" stroke="${colours.closest}" stroke-width="1.5" stroke-dasharray="2 2"/>`);
    out.push(`<text x="${cx}" y="${fmt(top + 12)}" dx="4" fill="${colours.closest}">closest approach ${figure(s.closestApproach)} s</text></g>`);
  }
  const verdict = s.passed ? 'PASS' : 'FAIL';
  const badgeX = f.width - margin.right - 64;
  out.push(`<g class="badge" data-verdict="${verdict.toLowerCase()}"><rect x="${badgeX}" y="${f.top + 4}" width="64" height="22" rx="4" fill="${s.passed ? colours.pass : colours.fail}"/>`);
  out.push(`<text x="${badgeX + 32}" y="${f.top + 20}" text-anchor="middle" fill="#ffffff" font-weight="bold">${verdict}</text></g>`);
  const st = s.figures;
  const ca = Number.isNaN(st.closestApproachShare) ? '' : `, ${figure(st.closestApproachShare * 100, 0)} % near closest approach`;
  const line = `median ${figure(st.medianCents)} ¢ · p95 ${figure(st.p95Cents)} ¢ · max ${figure(st.maxCents)} ¢ at ${figure(st.maxAt)} s · ${figure(st.judgedShare * 100, 0)} % of ${st.soundingFrames} frames judged${ca}`;
  out.push(`<text x="${margin.left}" y="${f.top + 14}" font-weight="bold">${escapeXml(s.name + (s.model ? ` — ${s.model} Doppler expected` : ''))}</text>`);
  out.push(`<text x="${margin.left}" y="${f.top + 29}" fill="#555555">${escapeXml(line)}</text>`);
  if (s.failures.length > 0) out.push(`<text x="${margin.left}" y="${f.top + 43}" fill="${colours.fail}">${escapeXml(s.failures[0])}</text>`);
  if (s.errorCents) errorStrip(s, { ...f, top: f.top + f.height - 8 }, limits, out);
  out.push('</g>');
}

/** Error in cents on the judged frames, with the ±p95 and ±max limits as lines. */
function errorStrip(s: ReportSource, f: Frame, limits: CheckLimits, out: string[]): void {
  const errs = s.errorCents!;
  let worst = limits.p95Cents * 2;
  for (let i = 0; i < errs.length; i++) if (Number.isFinite(errs[i])) worst = Math.max(worst, Math.abs(errs[i]));
  const span = Math.min(worst * 1.1, limits.maxCents * 3);
  const strip = { ...f, top: f.top - margin.top, height: margin.top + ERROR_HEIGHT - 40 + margin.bottom - 10 };
  const y = valueAxis(strip, -span, span, 'error (¢)', out);
  const x = timeAxis(strip, out);
  const clip = (v: number) => y(Math.max(-span, Math.min(span, v)));
  const x0 = margin.left;
  const x1 = f.width - margin.right;
  for (const [v, colour] of [[limits.p95Cents, colours.axis], [limits.maxCents, colours.fail]] as const) {
    if (v > span) continue;
    for (const sign of [1, -1]) out.push(`<line class="limit" x1="${x0}" x2="${x1}" y1="${fmt(y(sign * v))}" y2="${fmt(y(sign * v))}" stroke="${colour}" stroke-dasharray="4 3"/>`);
  }
  out.push(`<path data-series="error" d="${pathData(s.times, errs, x, clip)}" fill="none" stroke="${colours.heard}" stroke-width="1.2"/>`);
  if (s.closestApproach !== null) out.push(`<line x1="${fmt(x(s.closestApproach))}" x2="${fmt(x(s.closestApproach))}" y1="${fmt(y(span))}" y2="${fmt(y(-span))}" stroke="${colours.closest}" stroke-width="1.5" stroke-dasharray="2 2"/>`);
}

/** Renders the report as one standalone SVG document (UTF-8 text). */
export function renderReportSvg(report: CheckReport, options: ReportSvgOptions = {}): string {
  const width = Math.min(4000, Math.max(480, options.width ?? reportSvgDefaults.width));
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
  const panel = PANEL_HEIGHT + (report.sources.some((s) => s.errorCents) ? ERROR_HEIGHT : 0);
  const height = HEADER_HEIGHT + report.sources.length * panel + (report.timeScale ? STRIP_HEIGHT : 0) + 10;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="system-ui, sans-serif" font-size="12" fill="${colours.ink}">`);
  out.push(`<title>${escapeXml(report.title)}</title>`);
  out.push(`<rect width="${width}" height="${height}" fill="#ffffff"/>`);
  const failed = report.sources.filter((s) => !s.passed).length;
  const judged = report.mode === 'recorded-audio' ? 'the recorded audio the browser played' : 'an offline re-render of the script';
  const summary = `${report.sources.length - failed} of ${report.sources.length} sources pass · judged ${judged}`;
  out.push(`<text x="${margin.left}" y="24" font-size="16" font-weight="bold">${escapeXml(report.title)}</text>`);
  out.push(`<text x="${margin.left}" y="44" fill="#555555">${escapeXml(summary)} · black expected · blue heard · grey ±${figure(report.limits.p95Cents, 1)} ¢ (p95) · red ±${figure(report.limits.maxCents, 1)} ¢ (max) · shaded: not judged</text>`);
  report.sources.forEach((s, i) => sourcePanel(s, { top: HEADER_HEIGHT + i * panel, height: PANEL_HEIGHT, width, t0, t1 }, report.limits, out));
  if (report.timeScale) {
    const f = { top: HEADER_HEIGHT + report.sources.length * panel, height: STRIP_HEIGHT, width, t0, t1 };
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
      const st = s.figures;
      const verdict = s.passed ? 'pass' : 'fail';
      const spans = s.unjudged.map((u) => `${REASON_TEXT[u.reason] ?? u.reason} ${figure(u.from)}–${figure(u.to)} s`).join('; ');
      return `<tr><td>${escapeXml(s.name)}</td><td class="${verdict}">${verdict.toUpperCase()}</td><td>${figure(st.medianCents)}</td><td>${figure(st.p95Cents)}</td><td>${figure(st.maxCents)} at ${figure(st.maxAt)} s</td><td>${figure(st.judgedShare * 100, 0)} %</td><td>${Number.isNaN(st.closestApproachShare) ? '–' : `${figure(st.closestApproachShare * 100, 0)} %`}</td><td>${escapeXml([...s.failures, spans].filter((x) => x).join(' · '))}</td></tr>`;
    })
    .join('\n');
  const judged = report.mode === 'recorded-audio' ? 'the recorded audio the browser played' : 'an offline re-render of the script';
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
<p>Heard pitch against the pitch expected from the motion and the tuning, judged on ${judged}. Limits: p95 ${figure(report.limits.p95Cents, 1)} cents, max ${figure(report.limits.maxCents, 1)} cents, ${figure(report.limits.closestApproachShare * 100, 0)} % judged within ±${figure(report.limits.closestApproachSeconds, 2)} s of closest approach.</p>
<table>
<thead><tr><th>source</th><th>verdict</th><th>median ¢</th><th>p95 ¢</th><th>max ¢</th><th>judged</th><th>judged near closest approach</th><th>failures and unjudged spans</th></tr></thead>
<tbody>
${rows}
</tbody>
</table>
${renderReportSvg(report, options)}
</body>
</html>
`;
}
