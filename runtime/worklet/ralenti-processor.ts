// The AudioWorkletProcessor: registration, message hand-off and one call into the engine host per render quantum.
import { EngineHost, errorMessage, type RenderClock } from './engine-host';
import { PROCESSOR_NAME, decodeCommand, type ProcessorOptions, type Report } from '../protocol';
import { answerClose } from './close-report';
// Registers the recording capture tap in the same module (runtime/recording/capture-processor.ts).
import '../recording/capture-processor';

/**
 * The best clock the AudioWorkletGlobalScope offers: `performance` where it exists; Chromium does not expose it there
 * (checked in Chromium 156), so Date.now, whose 1 ms steps average out over the host's one-second load average.
 */
function renderClock(): RenderClock {
  const perf = (globalThis as { performance?: { now?: () => number } }).performance;
  if (perf && typeof perf.now === 'function') return { name: 'performance.now', now: () => perf.now!() };
  return { name: 'Date.now', now: Date.now };
}

/** Answers a close command when the engine was never built (its construction failed): nothing to dispose. */
function answerWithoutEngine(data: unknown, contextTime: number): void {
  const command = decodeCommand(data);
  if (typeof command !== 'string' && command.type === 'close') answerClose(command.reply, { type: 'closed', contextTime, engineDisposed: false, kernel: null });
}

/** Hosts the Ralenti engine on the audio thread; process() never throws. */
class RalentiProcessor extends AudioWorkletProcessor {
  private readonly host: EngineHost | null = null;

  constructor(options: AudioWorkletNodeOptions) {
    super(options);
    const post = (report: Report): void => this.port.postMessage(report);
    try {
      this.host = new EngineHost({
        sampleRate,
        startContextTime: currentTime,
        processorOptions: options.processorOptions as ProcessorOptions,
        post,
        clock: renderClock(),
      });
    } catch (err) {
      post({ type: 'error', where: 'construct', message: errorMessage(err), count: 1 });
    }
    this.port.onmessage = (event: MessageEvent): void => {
      if (this.host) this.host.handle(event.data);
      else answerWithoutEngine(event.data, currentTime);
    };
  }

  process(_inputs: Float32Array[][], outputs: Float32Array[][]): boolean {
    if (this.host) return this.host.process(outputs[0], outputs);
    for (const out of outputs) for (const ch of out) ch.fill(0);
    return true;
  }
}

registerProcessor(PROCESSOR_NAME, RalentiProcessor);
