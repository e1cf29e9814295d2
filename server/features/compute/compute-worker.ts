/**
 * The compute workers' entry (piscina loads it in each worker thread under tsx). Only pure
 * computation and file reads happen here: no database, no network.
 */
import { setPriority } from 'node:os';
import type { MessagePort } from 'node:worker_threads';
import { Piscina } from 'piscina';
import { computePlanCheck, type PlanCheckComputeInput } from '../plans/worker.ts';
import { computeImport, type ImportComputeInput, type ImportComputeOutput } from '../runs/worker.ts';

/**
 * Niceness of a compute thread. On Linux a thread's nice value is its own (setpriority(2), "BUGS"),
 * so only this worker yields: when the cores are busy, the event loop that answers every request
 * gets the CPU first and heavy jobs take longer instead.
 */
const COMPUTE_NICENESS = 5;
try {
  setPriority(COMPUTE_NICENESS);
} catch {
  // Not allowed here (some containers): the work still runs off the event loop, at normal priority.
}

export type ComputeTask =
  | { kind: 'import-file'; input: ImportComputeInput }
  | { kind: 'plan-check'; input: PlanCheckComputeInput }
  /** Test hook: keeps the thread busy for `ms` of CPU time (proves the event loop stays free). */
  | { kind: 'spin'; ms: number };

/** What the pool sends a thread: the task, and a port to say when this thread starts it (its time limit starts then). */
export interface ComputeJob {
  task: ComputeTask;
  started: MessagePort;
}

/**
 * An import's answer with its tracks' packed columns (megabytes each) moved to the event loop's thread
 * instead of copied (piscina's transferable: the list to move, and the value).
 */
function handedOver(output: ImportComputeOutput): ImportComputeOutput {
  if (!output.ok) return output;
  const buffers = output.records.map((r) => r.children.track.raw.buffer as ArrayBuffer);
  const transferable = {
    get [Piscina.transferableSymbol]() {
      return buffers;
    },
    get [Piscina.valueSymbol]() {
      return output;
    },
  };
  return Piscina.move(transferable as unknown as Parameters<typeof Piscina.move>[0]) as unknown as ImportComputeOutput;
}

export default async function runComputeJob({ task, started }: ComputeJob): Promise<unknown> {
  // The pool closes the channel when the job ends.
  started.postMessage('started');
  switch (task.kind) {
    case 'import-file':
      return handedOver(await computeImport(task.input));
    case 'plan-check':
      return computePlanCheck(task.input);
    case 'spin': {
      const until = Date.now() + task.ms;
      let spins = 0;
      while (Date.now() < until) spins++;
      return spins;
    }
  }
}
