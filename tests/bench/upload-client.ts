/**
 * The client of the bench's api-upload case (upload-case.ts), in its own process as a browser would
 * be: making and sending the multipart body never runs on the measured server's event loop, and its
 * CPU is not counted as the server's. Sends one file when asked and answers with its timings.
 */
import { openAsBlob } from 'node:fs';

export interface UploadClientRequest {
  base: string;
  token: string;
  path: string;
  name: string;
}

export interface UploadClientReply {
  status: number;
  imported: number;
  problem: string | null;
  /** Request start and whole answer read, ms since the epoch (performance.timeOrigin + now: comparable across processes). */
  started_at: number;
  answered_at: number;
}

const now = (): number => performance.timeOrigin + performance.now();

process.on('message', (ask: UploadClientRequest) => {
  void (async () => {
    // The file stays on disk: it is streamed as it is sent, as a browser sends a chosen file.
    const form = new FormData();
    form.append('files', await openAsBlob(ask.path), ask.name);
    const startedAt = now();
    const response = await fetch(`${ask.base}/api/runs`, {
      method: 'POST',
      headers: { authorization: `Bearer ${ask.token}` },
      body: form,
    });
    const body = (await response.json()) as { imported?: unknown[] };
    const answeredAt = now();
    process.send!({
      status: response.status,
      imported: body.imported?.length ?? 0,
      problem: response.status === 201 ? null : JSON.stringify(body),
      started_at: startedAt,
      answered_at: answeredAt,
    } satisfies UploadClientReply);
  })();
});
