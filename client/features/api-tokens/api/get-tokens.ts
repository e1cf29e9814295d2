import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ApiToken, ApiTokenListAnswer } from '../../../../shared/auth/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { tokenKeys } from './token-keys.ts';

export async function getTokens(): Promise<ApiToken[]> {
  const { tokens } = await api.get<ApiTokenListAnswer>('/auth/tokens');
  return tokens;
}

export const tokensQueryOptions = () => queryOptions({ queryKey: tokenKeys.lists(), queryFn: getTokens });

export function useTokens() {
  return useQuery(tokensQueryOptions());
}
