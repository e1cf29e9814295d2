/**
 * One upload of `npm run load` and its tally, shared by the 3-hour upload round (http-load.ts) and the 100-mile
 * upload driver (upload-driver.ts): the answer's status (or the client's socket error) counted, whether one run
 * was stored, and how long it took.
 */

/** Longest a single upload may take before the client gives up on it. */
export const UPLOAD_TIMEOUT_MS = 180_000;

export class UploadTally {
  readonly statuses: Record<string, number> = {};
  readonly latencies: number[] = [];
  stored = 0;

  /** Sends one GPX file as `POST /api/runs` with the token and counts the outcome. */
  async upload(base: string, token: string, file: Uint8Array<ArrayBuffer> | string, name: string): Promise<void> {
    const form = new FormData();
    form.append('files', new Blob([file], { type: 'application/gpx+xml' }), name);
    const started = performance.now();
    try {
      const response = await fetch(`${base}/api/runs`, {
        method: 'POST',
        headers: { authorization: `Bearer ${token}` },
        body: form,
        signal: AbortSignal.timeout(UPLOAD_TIMEOUT_MS),
      });
      const body = (await response.json()) as { imported?: unknown[] };
      this.count(String(response.status));
      if (response.status === 201 && body.imported?.length === 1) this.stored++;
    } catch (error) {
      // fetch's TypeError says only "fetch failed"; its cause names the socket error.
      const cause = error instanceof Error ? (error.cause as { code?: string; message?: string } | undefined) : undefined;
      this.count(error instanceof Error ? `${error.name}${cause ? ` (${cause.code ?? cause.message})` : ''}` : 'error');
    }
    this.latencies.push(performance.now() - started);
  }

  /** Median and slowest upload (ms), rounded. */
  spread(): { p50_ms: number; max_ms: number } {
    const sorted = [...this.latencies].sort((a, b) => a - b);
    return {
      p50_ms: Math.round(sorted[Math.floor(sorted.length / 2)] ?? 0),
      max_ms: Math.round(sorted[sorted.length - 1] ?? 0),
    };
  }

  private count(key: string): void {
    this.statuses[key] = (this.statuses[key] ?? 0) + 1;
  }
}
