/**
 * The password threads' entry (piscina loads it in each worker thread under tsx): bcrypt hashing and
 * checking only, so the event loop that answers every request never spends ~0.25 s of CPU on one.
 */
import { setPriority } from 'node:os';
import bcrypt from 'bcryptjs';

/**
 * Same niceness as the compute threads (server/features/compute/compute-worker.ts): when the cores are
 * busy the event loop gets the CPU first, and sign-ins compete with imports on equal terms.
 */
const PASSWORD_NICENESS = 5;
try {
  setPriority(PASSWORD_NICENESS);
} catch {
  // Not allowed here (some containers): the work still runs off the event loop, at normal priority.
}

export type PasswordTask = { kind: 'hash'; password: string; cost: number } | { kind: 'compare'; password: string; hash: string };

export default async function runPasswordTask(task: PasswordTask): Promise<string | boolean> {
  switch (task.kind) {
    case 'hash':
      return bcrypt.hash(task.password, task.cost);
    case 'compare':
      return bcrypt.compare(task.password, task.hash);
  }
}
