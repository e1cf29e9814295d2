import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type {
  BillingAnswer,
  FeeAnswer,
  FeeInput,
  FeeWaiverAnswer,
  MyFeesAnswerSchema,
  UrlAnswerSchema,
} from '../../../../shared/fees/schemas.ts';
import { api } from '../../../lib/api-client.ts';

export const feeKeys = {
  all: ['fees'] as const,
  billing: (squadId: string) => ['fees', 'billing', squadId] as const,
  mine: () => ['fees', 'mine'] as const,
};

type UrlAnswer = z.output<typeof UrlAnswerSchema>;
export type MyFees = z.output<typeof MyFeesAnswerSchema>['fees'];

const squadPath = (squadId: string) => `/squads/${encodeURIComponent(squadId)}`;

export function useSquadBilling(squadId: string) {
  return useQuery({ queryKey: feeKeys.billing(squadId), queryFn: () => api.get<BillingAnswer>(`${squadPath(squadId)}/billing`) });
}

export const billingCsvHref = (squadId: string) => `/api${squadPath(squadId)}/billing.csv`;

export function useSetFee(squadId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FeeInput) => api.put<FeeAnswer>(`${squadPath(squadId)}/fee`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: feeKeys.all }),
  });
}

export function useSetWaiver(squadId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ runnerId, waived }: { runnerId: string; waived: boolean }) =>
      api.put<FeeWaiverAnswer>(`${squadPath(squadId)}/members/${encodeURIComponent(runnerId)}/fee-waiver`, { waived }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: feeKeys.billing(squadId) }),
  });
}

export function useMyFees() {
  return useQuery({
    queryKey: feeKeys.mine(),
    queryFn: async () => (await api.get<z.output<typeof MyFeesAnswerSchema>>('/me/fees')).fees,
  });
}

/** Opens the payment service's hosted checkout: the card is typed there, never on our pages. */
export function useStartCheckout() {
  return useMutation({
    mutationFn: (squadId: string) => api.post<UrlAnswer>(`${squadPath(squadId)}/checkout`),
    onSuccess: ({ url }) => window.location.assign(url),
  });
}

export function useOpenPortal() {
  return useMutation({
    mutationFn: () => api.post<UrlAnswer>('/me/fees/portal'),
    onSuccess: ({ url }) => window.location.assign(url),
  });
}

export function useCancelFee() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (squadId: string) => api.post<void>(`${squadPath(squadId)}/fee/cancel`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: feeKeys.mine() }),
  });
}
