/**
 * A file read while it arrives (issue 19): the upload's bytes are written, as they come, into memory
 * shared with a compute thread (upload-to-disk.ts), and the thread's reader (xml-events.ts) reads what
 * has arrived and waits for the rest. Beside the bytes, a small control block says how many have
 * arrived and whether the file is whole; the receiving side updates it (`ArrivalWriter`) and wakes the
 * thread, the thread waits on it (`SharedArrival`) with bounds, so a slow or silent client never holds
 * a compute thread for long. Decisions and numbers: server/features/runs/README.md.
 */
import type { ArrivingXml } from './xml-events.ts';

/** A file whose bytes are still arriving in `memory` (longer than the file; 0 where nothing has arrived yet). */
export interface Arrival extends ArrivingXml {
  readonly memory: Buffer;
}

/** Why the reader stopped waiting for a file's bytes; the file is then read whole after it has arrived, or not at all. */
export type ArrivalStopReason = 'stopped' | 'stalled' | 'slow' | 'yielded';

export class ArrivalStopped extends Error {
  constructor(readonly reason: ArrivalStopReason) {
    super(`the file stopped arriving (${reason})`);
  }
}

/** Slots of the control block (Int32). */
const SEQUENCE = 0;
const ARRIVED = 1;
const STATE = 2;
const YIELD = 3;
const CONTROL_SLOTS = 4;

const ARRIVING = 0;
const COMPLETE = 1;
const STOPPED = 2;

/** The control block that goes beside an arriving file's memory. */
export function newArrivalControl(): SharedArrayBuffer {
  return new SharedArrayBuffer(CONTROL_SLOTS * Int32Array.BYTES_PER_ELEMENT);
}

/**
 * The receiving side's half: tells the reading thread what has arrived. Every change bumps the
 * sequence number the reader waits on, so a change between its look and its wait is never missed.
 */
export class ArrivalWriter {
  private readonly control: Int32Array;

  constructor(control: SharedArrayBuffer) {
    this.control = new Int32Array(control);
  }

  private changed(): void {
    Atomics.add(this.control, SEQUENCE, 1);
    Atomics.notify(this.control, SEQUENCE);
  }

  /** bytes[0, count) are in the memory now. */
  arrived(count: number): void {
    if (Atomics.load(this.control, STATE) !== ARRIVING) return;
    Atomics.store(this.control, ARRIVED, count);
    this.changed();
  }

  /** The file is whole: `length` bytes. */
  complete(length: number): void {
    if (Atomics.load(this.control, STATE) !== ARRIVING) return;
    Atomics.store(this.control, ARRIVED, length);
    Atomics.store(this.control, STATE, COMPLETE);
    this.changed();
  }

  /** The file will not arrive in this memory (client gone, body cut short, a limit crossed, too big for it). */
  stop(): void {
    if (Atomics.load(this.control, STATE) !== ARRIVING) return;
    Atomics.store(this.control, STATE, STOPPED);
    this.changed();
  }

  /** Asks the reader to give its thread back if it is still waiting for bytes (another job needs the thread). */
  askToYield(): void {
    Atomics.store(this.control, YIELD, 1);
    this.changed();
  }

  isWaitingForBytes(): boolean {
    return Atomics.load(this.control, STATE) === ARRIVING;
  }
}

/** How long the reading thread waits for bytes before it gives its thread back (the file is then read after arrival). */
export interface ArrivalWaitLimits {
  /** No new byte for this long. */
  stallMs: number;
  /** Waiting for bytes this long in all. */
  totalWaitMs: number;
}

export const ARRIVAL_WAIT_LIMITS: ArrivalWaitLimits = { stallMs: 2_000, totalWaitMs: 10_000 };

/** The reading thread's half (a compute thread: Atomics.wait blocks the thread, never an event loop). */
export class SharedArrival implements Arrival {
  readonly memory: Buffer;
  private readonly control: Int32Array;
  private waitedMs = 0;
  length = -1;

  constructor(
    memory: SharedArrayBuffer,
    control: SharedArrayBuffer,
    private readonly limits: ArrivalWaitLimits = ARRIVAL_WAIT_LIMITS,
  ) {
    this.memory = Buffer.from(memory);
    this.control = new Int32Array(control);
  }

  waitFor(end: number): number {
    for (;;) {
      const sequence = Atomics.load(this.control, SEQUENCE);
      const state = Atomics.load(this.control, STATE);
      const arrived = Atomics.load(this.control, ARRIVED);
      if (state === COMPLETE) {
        this.length = arrived;
        return arrived;
      }
      if (state === STOPPED) throw new ArrivalStopped('stopped');
      if (arrived >= end) return arrived;
      if (Atomics.load(this.control, YIELD) === 1) throw new ArrivalStopped('yielded');
      const wait = Math.min(this.limits.stallMs, this.limits.totalWaitMs - this.waitedMs);
      if (wait <= 0) throw new ArrivalStopped('slow');
      const started = performance.now();
      const woken = Atomics.wait(this.control, SEQUENCE, sequence, wait);
      this.waitedMs += performance.now() - started;
      if (woken === 'timed-out' && Atomics.load(this.control, SEQUENCE) === sequence) {
        throw new ArrivalStopped(this.waitedMs >= this.limits.totalWaitMs ? 'slow' : 'stalled');
      }
    }
  }
}

/** The same arrival seen `offset` bytes in (a UTF-8 byte-order mark the reader skips). */
export function arrivalFrom(arrival: Arrival, offset: number): ArrivingXml {
  if (offset === 0) return arrival;
  return {
    waitFor: (end) => Math.max(0, arrival.waitFor(end + offset) - offset),
    get length() {
      return arrival.length < 0 ? -1 : Math.max(0, arrival.length - offset);
    },
  };
}
