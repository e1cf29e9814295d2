/**
 * The password threads' entry (piscina loads it in each worker thread under tsx): bcrypt hashing and
 * checking only, so the event loop that answers every request never spends ~0.25 s of CPU on one.
 */
import bcrypt from 'bcryptjs';
import { niceThisThread } from '../../lib/thread-nice.ts';

/**
 * 5 nice values below the event loop, as the compute threads by default (COMPUTE_NICE): when the cores are busy
 * the event loop gets the CPU first (a sign-in flood of ~0.25 s hashes never stalls reads or /api/health), and
 * sign-ins compete with imports on equal terms. Not tied to COMPUTE_NICE: a sign-in is someone waiting.
 */
const PASSWORD_NICENESS = 5;
niceThisThread(PASSWORD_NICENESS);

export type PasswordTask = { kind: 'hash'; password: string; cost: number } | { kind: 'compare'; password: string; hash: string };

export default async function runPasswordTask(task: PasswordTask): Promise<string | boolean> {
  switch (task.kind) {
    case 'hash':
      return bcrypt.hash(task.password, task.cost);
    case 'compare':
      return bcrypt.compare(task.password, task.hash);
  }
}
