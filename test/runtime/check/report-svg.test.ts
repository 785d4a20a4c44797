import { describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { escapeXml, niceTicks, pathData, renderReportHtml, renderReportSvg, type CheckReport } from '../../../runtime/check/report-svg';
import { writeReport } from '../../../runtime/check/write-report';

// jsdom ships without type declarations; load it through require with the small part of its API used here.
interface JsdomWindow {
  document: Document;
  DOMParser: typeof DOMParser;
}
const { JSDOM } = createRequire(import.meta.url)('jsdom') as { JSDOM: new (html: string) => { window: JsdomWindow } };

function series(count: number, f: (t: number) => number, gapFrom = -1, gapTo = -1) {
  const times = Float64Array.from({ length: count }, (_, i) => i * 0.01);
  const values = times.map((t, i) => (i >= gapFrom && i < gapTo ? NaN : f(t)));
  return { times, values };
}

function figures(errors: number[], sounding: number, ca = NaN) {
  const abs = errors.map(Math.abs).sort((a, b) => a - b);
  return { medianCents: abs[abs.length >> 1], p95Cents: abs[Math.floor(abs.length * 0.95)], maxCents: abs[abs.length - 1], maxAt: 1.5, soundingFrames: sounding, judgedFrames: abs.length, judgedShare: abs.length / sounding, closestApproachShare: ca };
}

function sampleReport(): CheckReport {
  const a = series(300, (t) => 440 * (1 + 0.05 * Math.cos(t)));
  const aHeard = series(300, (t) => 440 * (1 + 0.05 * Math.cos(t)) * 1.0005, 100, 120);
  const b = series(300, () => 220);
  const bHeard = series(300, () => 223);
  return {
    title: 'pass <by> & "fly"',
    mode: 're-render',
    limits: { p95Cents: 5, maxCents: 20, closestApproachShare: 0.9, closestApproachSeconds: 0.5, judgedShare: 0.5 },
    sources: [
      { name: 'car', times: a.times, expectedHz: a.values, heardHz: aHeard.values, unjudged: [{ from: 1, to: 1.19, reason: 'unvoiced' }], figures: figures([0.9, 0.8], 300, 0.95), closestApproach: 1.5, passed: true, failures: [] },
      { name: 'drone', times: b.times, expectedHz: b.values, heardHz: bHeard.values, unjudged: [], figures: figures([23.5, 23.6], 300), closestApproach: null, passed: false, failures: ['drone: error 23.6 cents at 1.50 s > max 20 cents'] },
    ],
    timeScale: { times: a.times, values: a.times.map((t) => (t < 1.5 ? 1 : 0.5)) },
  };
}

function parseSvg(text: string): Document {
  const { window } = new JSDOM('');
  return new window.DOMParser().parseFromString(text, 'image/svg+xml');
}

describe('renderReportSvg', () => {
  it('produces SVG that parses, with the band, expected and heard paths per source', () => {
    const doc = parseSvg(renderReportSvg(sampleReport()));
    expect(doc.getElementsByTagName('parsererror').length).toBe(0);
    expect(doc.documentElement.tagName).toBe('svg');
    const sources = Array.from(doc.querySelectorAll('g.source'));
    expect(sources.map((g) => g.getAttribute('data-source'))).toEqual(['car', 'drone']);
    for (const g of sources) {
      const paths = Array.from(g.querySelectorAll('path')).map((p) => p.getAttribute('data-series'));
      expect(paths).toEqual(['band', 'expected', 'heard']);
    }
    expect(doc.querySelectorAll('path[data-series="time-scale"]').length).toBe(1);
    expect(doc.querySelectorAll('path').length).toBe(7);
  });

  it('shades unjudged spans by reason, marks closest approach, and says what was judged', () => {
    const text = renderReportSvg(sampleReport());
    const doc = parseSvg(text);
    expect(Array.from(doc.querySelectorAll('g.source[data-source="car"] rect.unjudged')).map((r) => r.getAttribute('data-reason'))).toEqual(['unvoiced']);
    expect(doc.querySelectorAll('g.source[data-source="car"] g.closest-approach').length).toBe(1);
    expect(doc.querySelectorAll('g.source[data-source="drone"] g.closest-approach').length).toBe(0);
    expect(text).toContain('an offline re-render of the script');
    expect(text).toContain('drone: error 23.6 cents at 1.50 s');
    expect(renderReportSvg({ ...sampleReport(), mode: 'recorded-audio' })).toContain('the recorded audio the browser played');
  });

  it('gives each source a pass or fail badge matching its verdict', () => {
    const doc = parseSvg(renderReportSvg(sampleReport()));
    const badges = Array.from(doc.querySelectorAll('g.badge'));
    expect(badges.map((b) => b.getAttribute('data-verdict'))).toEqual(['pass', 'fail']);
    expect(badges.map((b) => b.textContent?.trim())).toEqual(['PASS', 'FAIL']);
  });

  it('breaks the measured path at frames without pitch and escapes text', () => {
    const text = renderReportSvg(sampleReport());
    const doc = parseSvg(text);
    const measured = doc.querySelector('g.source[data-source="car"] path[data-series="heard"]')!.getAttribute('d')!;
    expect(measured.match(/M/g)!.length).toBe(2);
    expect(doc.querySelector('title')!.textContent).toBe('pass <by> & "fly"');
    expect(text).toContain('median');
  });

  it('leaves the time-scale strip out when no time scale is given', () => {
    const report = { ...sampleReport(), timeScale: undefined };
    const doc = parseSvg(renderReportSvg(report));
    expect(doc.querySelectorAll('path[data-series="time-scale"]').length).toBe(0);
  });
});

describe('renderReportHtml', () => {
  it('embeds the SVG inline with a figures row per source and no external resources', () => {
    const html = renderReportHtml(sampleReport());
    const { window } = new JSDOM(html);
    const doc = window.document;
    expect(doc.querySelectorAll('body > svg').length).toBe(1);
    expect(doc.querySelectorAll('tbody tr').length).toBe(2);
    expect(doc.querySelector('tbody tr td.fail')!.textContent).toBe('FAIL');
    expect(doc.querySelectorAll('link, script, img, [src]').length).toBe(0);
  });
});

describe('report helpers', () => {
  it('makes 1-2-5 ticks covering the range', () => {
    expect(niceTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(431, 468, 5)).toEqual([440, 450, 460]);
    expect(niceTicks(-0.3, 0.25, 5)).toEqual([-0.2, 0, 0.2]);
  });

  it('draws path data through finite points only', () => {
    const d = pathData([0, 1, 2, 3], [0, NaN, 2, 3], (v) => v * 10, (v) => 100 - v);
    expect(d).toBe('M0 100M20 98L30 97');
  });

  it('escapes the five XML special characters', () => {
    expect(escapeXml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&apos;&amp;&apos;&lt;/a&gt;');
  });

  it('writes SVG, HTML or PNG by extension and refuses others', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'ralenti-report-'));
    try {
      await writeReport(join(dir, 'r.svg'), sampleReport());
      await writeReport(join(dir, 'r.html'), sampleReport());
      await writeReport(join(dir, 'r.png'), sampleReport());
      expect(readFileSync(join(dir, 'r.svg'), 'utf8').startsWith('<svg')).toBe(true);
      expect(readFileSync(join(dir, 'r.html'), 'utf8').startsWith('<!doctype html>')).toBe(true);
      // PNG signature and the IHDR width in pixels (ISO/IEC 15948 §5.2; docs/references.md §14c).
      const png = readFileSync(join(dir, 'r.png'));
      expect(Array.from(png.subarray(0, 8))).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
      expect(png.readUInt32BE(16)).toBe(960);
      await expect(writeReport(join(dir, 'r.gif'), sampleReport())).rejects.toThrow(/\.svg, \.html or \.png/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
