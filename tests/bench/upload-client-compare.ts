/**
 * Which client stands in for a browser in the api-upload case (README, "The bench's client"): each
 * round starts a fresh client process of each kind in turn (`http`, `fetch`, alternating which goes
 * first) and has it send the same file twice to a bare server in a process of its own that drops the
 * bytes and answers at once: the first send is the cold one (a fresh process), the second the warm one.
 *
 *   node --import tsx tests/bench/upload-client-compare.ts <file> [rounds=5]
 *
 * Prints one line per send and the medians; every number is request start → whole answer read, ms.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import type { UploadClientKind, UploadClientReply, UploadClientRequest } from './upload-client.ts';

if (process.argv[2] === '--bare-server') {
  const bare = createServer((req, res) => {
    req.resume();
    req.once('end', () => res.writeHead(201, { 'content-type': 'application/json' }).end('{"imported":[{}]}'));
  });
  bare.listen(0, '127.0.0.1', () => process.send!((bare.address() as AddressInfo).port));
  process.on('disconnect', () => process.exit(0));
} else {
  const file = process.argv[2];
  const rounds = Number(process.argv[3] ?? 5);
  if (!file) throw new Error('usage: upload-client-compare.ts <file> [rounds]');

  const forkTs = (script: string, args: string[] = []): ChildProcess => fork(script, args, { execArgv: ['--import', 'tsx'] });
  const send = (client: ChildProcess, ask: UploadClientRequest) =>
    new Promise<UploadClientReply>((resolve) => {
      client.once('message', (reply: UploadClientReply) => resolve(reply));
      client.send(ask);
    });

  const server = forkTs(import.meta.filename, ['--bare-server']);
  const port = await new Promise<number>((resolve) => server.once('message', (p: number) => resolve(p)));
  const base = `http://127.0.0.1:${port}`;
  const seen: Record<string, number[]> = {};
  try {
    for (let round = 0; round < rounds; round++) {
      const kinds: UploadClientKind[] = round % 2 === 0 ? ['http', 'fetch'] : ['fetch', 'http'];
      for (const kind of kinds) {
        const client = forkTs(path.join(import.meta.dirname, 'upload-client.ts'));
        for (const phase of ['cold', 'warm'] as const) {
          const reply = await send(client, { base, token: 'none', path: file, name: path.basename(file), client: kind });
          if (reply.status !== 201) throw new Error(`${kind}: ${reply.status} ${reply.problem}`);
          const ms = Math.round(reply.answered_at - reply.started_at);
          (seen[`${kind} ${phase}`] ??= []).push(ms);
          console.log(`round ${round + 1} ${kind} ${phase}: ${ms} ms, ${reply.minor_faults} minor faults in the client`);
        }
        client.kill();
      }
    }
  } finally {
    server.kill();
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  for (const [key, xs] of Object.entries(seen)) console.log(`${key}: median ${median(xs)} ms (${xs.join(', ')})`);
}
