import { useQuery } from '@tanstack/react-query';
import type { StorageUsage } from '../../../../shared/runs/schemas.ts';
import { api } from '../../../lib/api-client.ts';

/** GET /api/me/storage: the original files kept against the account's quota. */
export function getStorageUsage(): Promise<StorageUsage> {
  return api.get<StorageUsage>('/me/storage');
}

export function useStorageUsage() {
  return useQuery({ queryKey: ['me', 'storage'], queryFn: getStorageUsage });
}
