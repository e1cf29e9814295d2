import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  CreateLibrarySessionInput,
  LibrarySession,
  LibrarySessionAnswer,
  LibrarySessionListAnswer,
  UpdateLibrarySessionInput,
} from '../../../../shared/plans/prescribe-schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { planKeys } from './plan-keys.ts';

export async function getLibrary(): Promise<LibrarySession[]> {
  const { sessions } = await api.get<LibrarySessionListAnswer>('/library');
  return sessions;
}

export const libraryQueryOptions = () => queryOptions({ queryKey: planKeys.library(), queryFn: getLibrary });

export function useLibrary() {
  return useQuery(libraryQueryOptions());
}

export async function createLibrarySession(body: CreateLibrarySessionInput): Promise<LibrarySession> {
  const { session } = await api.post<LibrarySessionAnswer>('/library', body);
  return session;
}

export async function updateLibrarySession({ id, ...body }: UpdateLibrarySessionInput & { id: string }): Promise<LibrarySession> {
  const { session } = await api.patch<LibrarySessionAnswer>(`/library/${encodeURIComponent(id)}`, body);
  return session;
}

export async function deleteLibrarySession(id: string): Promise<void> {
  await api.delete(`/library/${encodeURIComponent(id)}`);
}

function useLibraryMutation<A, R>(fn: (arg: A) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => queryClient.invalidateQueries({ queryKey: planKeys.library() }) });
}

export const useCreateLibrarySession = () => useLibraryMutation(createLibrarySession);
export const useUpdateLibrarySession = () => useLibraryMutation(updateLibrarySession);
export const useDeleteLibrarySession = () => useLibraryMutation(deleteLibrarySession);
