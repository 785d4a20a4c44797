// Tuning-load benchmark: parseTuning on the largest valid tuning file (64 groups × three 64-key curves, about 1 MB
// at a 2-space indent), beside JSON.parse of the same text in the same run — the ratio is the validation's cost.
// The goal (issue 18): a 1 MB tuning file loads within a second; an oversized text is refused before parsing.
import { defaultTuning, parseTuning, serializeTuning, MAX_TUNING_TEXT } from '../src/tuning';

const ROUNDS = 15;

function largestTuningText(): string {
  const doc = JSON.parse(serializeTuning(defaultTuning));
  const g = doc.groups.effects;
  const keys = (y: number) => Array.from({ length: 64 }, (_, i) => ({ x: (4 * i) / 63, y }));
  doc.groups = {};
  for (let i = 0; i < 64; i++) doc.groups[i === 0 ? 'effects' : `group-${i}`] = { ...g, pitch: { ...g.pitch, keys: keys(0) }, tone: { ...g.tone, keys: keys(1000) }, level: { ...g.level, keys: keys(0) } };
  return JSON.stringify(doc, null, 2);
}

function times(f: () => void): number[] {
  const t: number[] = [];
  for (let k = 0; k < ROUNDS; k++) {
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
  }
  return t.sort((a, b) => a - b);
}

/** Runs the benchmark; prints a table unless `json`. */
export async function run(options: { json: boolean }): Promise<object> {
  const text = largestTuningText();
  const oversized = ' '.repeat(MAX_TUNING_TEXT + 1);
  const parse = times(() => parseTuning(text));
  const json = times(() => JSON.parse(text));
  const refuse = times(() => {
    try {
      parseTuning(oversized);
    } catch {
      // refused, as intended
    }
  });
  const med = (t: number[]) => t[Math.floor(t.length / 2)];
  const result = {
    textBytes: text.length,
    parseTuningMs: { median: med(parse), min: parse[0], max: parse[parse.length - 1] },
    jsonParseMs: { median: med(json), min: json[0], max: json[json.length - 1] },
    ratioToJsonParse: med(parse) / med(json),
    refuseOversizedMs: med(refuse),
  };
  if (!options.json) {
    console.log(`| text | parseTuning ms (median, min–max) | JSON.parse ms | ratio | refusing ${MAX_TUNING_TEXT + 1} chars, ms |`);
    console.log('| --- | --- | --- | --- | --- |');
    console.log(
      `| ${(text.length / 1e6).toFixed(2)} MB | ${med(parse).toFixed(1)} (${parse[0].toFixed(1)}–${parse[parse.length - 1].toFixed(1)}) | ${med(json).toFixed(1)} | ×${result.ratioToJsonParse.toFixed(1)} | ${med(refuse).toFixed(3)} |`,
    );
  }
  return result;
}
