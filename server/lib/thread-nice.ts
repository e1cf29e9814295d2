import { readlinkSync } from 'node:fs';
import { getPriority, setPriority } from 'node:os';

/** The calling thread's Linux task id (its TID), from /proc/thread-self ("<pid>/task/<tid>"); null elsewhere. */
export function ownThreadId(): number | null {
  try {
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    return Number.isSafeInteger(tid) && tid > 0 ? tid : null;
  } catch {
    return null;
  }
}

/**
 * Makes the calling thread `steps` nice values less urgent than it started (the thread that made it: the event
 * loop), at most 19, and gives its nice value after; null when nothing was set. Relative, so a server started
 * under `nice 10` still keeps its background threads below its event loop. On Linux a nice value belongs to one
 * thread (setpriority(2), "BUGS"), so setting this thread's own TID leaves the event loop and every other thread
 * at theirs. Elsewhere it does nothing: there setpriority names the whole process. Raising a nice value needs no
 * privilege and lowering it back would, so a thread once niced stays so (a pool makes new threads instead).
 */
export function niceThisThread(steps: number): number | null {
  if (!Number.isInteger(steps) || steps <= 0) return null;
  const tid = ownThreadId();
  if (tid === null) return null;
  try {
    const nice = Math.min(19, getPriority(tid) + steps);
    setPriority(tid, nice);
    return nice;
  } catch {
    // Not allowed here (some containers): the work still runs off the event loop, at the process's priority.
    return null;
  }
}
