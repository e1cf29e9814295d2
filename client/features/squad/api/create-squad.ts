import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { CreateSquadInputSchema, Squad, SquadAnswer } from '../../../../shared/squads/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { squadKeys } from './squad-keys.ts';

export async function createSquad(input: z.output<typeof CreateSquadInputSchema>): Promise<Squad> {
  const { squad } = await api.post<SquadAnswer>('/squads', input);
  return squad;
}

export function useCreateSquad() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSquad,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: squadKeys.lists() }),
  });
}
