import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '../../schemas/auth';
import {
  addMemberResponseSchema,
  memberListSchema,
  memberSchema,
  type AddMemberRequest,
} from '../../schemas/workspace';
import { apiFetch } from './api';
import { staleTimes } from './query-client';
import { sessionKeys } from './session';
import { z } from 'zod';

/** Query keys of workspace members (GET /api/v1/workspaces/:workspaceId/members). */
export const memberKeys = {
  all: ['members'] as const,
  list: (workspaceId: number) => [...memberKeys.all, workspaceId] as const,
};

const memberAnswerSchema = z.object({ member: memberSchema });

const membersPath = (workspaceId: number) => `/api/v1/workspaces/${workspaceId}/members`;

export function useMembers(workspaceId: number) {
  return useQuery({
    queryKey: memberKeys.list(workspaceId),
    queryFn: ({ signal }) => apiFetch(membersPath(workspaceId), { schema: memberListSchema, signal }),
    select: (answer) => answer.members,
    staleTime: staleTimes.members,
  });
}

/** Owners only. The answer's `initialPassword` is present once, when a new account was made. */
export function useAddMember(workspaceId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: AddMemberRequest) =>
      apiFetch(membersPath(workspaceId), { method: 'POST', body, schema: addMemberResponseSchema }),
    onSuccess: () => client.invalidateQueries({ queryKey: memberKeys.list(workspaceId) }),
  });
}

/** Owners only; 409 when it would leave the workspace without an owner. */
export function useChangeRole(workspaceId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: number; role: Role }) =>
      apiFetch(`${membersPath(workspaceId)}/${userId}`, { method: 'PATCH', body: { role }, schema: memberAnswerSchema }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: memberKeys.list(workspaceId) }),
        // the signed-in user may have changed their own role
        client.invalidateQueries({ queryKey: sessionKeys.all }),
      ]),
  });
}

/** Owners only; 409 when it would remove the last owner. */
export function useRemoveMember(workspaceId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => apiFetch(`${membersPath(workspaceId)}/${userId}`, { method: 'DELETE' }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: memberKeys.list(workspaceId) }),
        client.invalidateQueries({ queryKey: sessionKeys.all }),
      ]),
  });
}
