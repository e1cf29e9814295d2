import type { CaughtMessage, OutboxAnswer } from '../../../../shared/api/outbox.ts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { outboxKeys } from './outbox-keys.ts';

export type { CaughtMessage };

/** Messages the local mail catcher holds, newest first; the API answers 404 in production. */
export async function getOutbox(): Promise<CaughtMessage[]> {
  const { messages } = await api.get<OutboxAnswer>('/dev/outbox');
  return messages;
}

export const outboxQueryOptions = () => queryOptions({ queryKey: outboxKeys.lists(), queryFn: getOutbox });

export function useOutbox() {
  return useQuery(outboxQueryOptions());
}
