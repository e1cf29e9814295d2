import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { DigestReceipt } from './types.ts';

export async function sendDigest({ squadId, week }: { squadId: string; week: string }): Promise<DigestReceipt> {
  return api.post<DigestReceipt>(`/squads/${encodeURIComponent(squadId)}/digest`, { week });
}

export function useSendDigest() {
  return useMutation({ mutationFn: sendDigest });
}
