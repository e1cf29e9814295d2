/**
 * The compute workers' entry (piscina loads it in each worker thread under tsx). Only pure
 * computation and file reads happen here: no database, no network.
 */
import { workerData, type MessagePort } from 'node:worker_threads';
import { Piscina } from 'piscina';
import { niceThisThread, ownThreadId } from '../../lib/thread-nice.ts';
import { computePlanCheck, type PlanCheckComputeInput } from '../plans/worker.ts';
import { computeImport, type ImportComputeInput, type ImportComputeOutput } from '../runs/worker.ts';

/** What the pool gives each of its threads when it starts them (piscina's workerData). */
export interface ComputeThreadSettings {
  /** COMPUTE_NICE: nice values this thread runs below the event loop (0 = as urgent), so reads come before imports. */
  nice: number;
}

niceThisThread((workerData as ComputeThreadSettings | undefined)?.nice ?? 0);

export type ComputeTask =
  | { kind: 'import-file'; input: ImportComputeInput }
  | { kind: 'plan-check'; input: PlanCheckComputeInput }
  /** Test hook: keeps the thread busy for `ms` of CPU time (proves the event loop stays free). */
  | { kind: 'spin'; ms: number }
  /** Test hook: this thread's Linux task id (tests read its nice value from /proc). */
  | { kind: 'thread-id' };

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
    case 'thread-id':
      return ownThreadId();
  }
}
