// The audio thread's answer to the close command: one ClosedReport on the command's own reply port, then that port
// closes. Posted right after the engine is disposed, from the message handler, so that it comes also while the context
// is suspended (process() not running); process() then returns false at its next call.
import type { WasmKernel } from '../../src/dsp/index';
import type { ClosedReport, KernelMemory } from '../protocol';

/** The kernel's memory figures now, given `before` bytes in use before the close; null without a kernel. */
export function kernelMemory(kernel: WasmKernel | null, before: number): KernelMemory | null {
  if (kernel === null) return null;
  const bytesInUse = kernel.bytesInUse;
  return { bytesInUse, bytesReleased: before - bytesInUse, memoryBytes: kernel.exports.memory.buffer.byteLength };
}

/** Posts `report` on `reply` and closes it; nothing without a reply port, and never throws (the main thread may be gone). */
export function answerClose(reply: MessagePort | undefined, report: ClosedReport): void {
  if (reply === undefined) return;
  try {
    reply.postMessage(report);
    reply.close();
  } catch {
    // The other side is gone: nobody is waiting for the answer.
  }
}
