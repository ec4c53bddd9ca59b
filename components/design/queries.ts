import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import {
  designDetailSchema,
  designListSchema,
  designVersionResponseSchema,
  saveSpecResponseSchema,
  type CreateDesignRequest,
  type DesignSpecInput,
  type UpdateDesignRequest,
} from '../../schemas/design';
import { discretizeResponseSchema, type DiscretizeRequestBody } from '../../schemas/discretize';
import { leadPlacementResponseSchema, type LeadPlacementRequestBody } from '../../schemas/lead-placement';
import { apiFetch } from '../data/api';
import { staleTimes } from '../data/query-client';

/**
 * Query keys and hooks of designs (…/workspaces/:workspaceId/designs) and of the compute
 * API (POST /api/v1/discretize, POST /api/v1/lead-placement). One key root per resource; mutations invalidate through it.
 */
export const designKeys = {
  all: ['designs'] as const,
  workspace: (workspaceId: number) => [...designKeys.all, workspaceId] as const,
  lists: (workspaceId: number) => [...designKeys.workspace(workspaceId), 'list'] as const,
  list: (workspaceId: number, archived: boolean) => [...designKeys.lists(workspaceId), { archived }] as const,
  detail: (workspaceId: number, designId: number) => [...designKeys.workspace(workspaceId), 'detail', designId] as const,
  version: (workspaceId: number, designId: number, number: number) => [...designKeys.detail(workspaceId, designId), 'version', number] as const,
};

export const discretizeKeys = {
  all: ['discretize'] as const,
  /** the request body itself is the key: the compute API is stateless */
  request: (body: DiscretizeRequestBody) => [...discretizeKeys.all, body] as const,
};

/** The compute answer for a given body never changes. */
const COMPUTE_STALE_MS = Infinity;
/** Delay between the last keystroke and the compute request. */
export const ANALYSIS_DEBOUNCE_MS = 300;

const designsPath = (workspaceId: number) => `/api/v1/workspaces/${workspaceId}/designs`;

export function useDesigns(workspaceId: number, archived: boolean) {
  return useQuery({
    queryKey: designKeys.list(workspaceId, archived),
    queryFn: ({ signal }) => apiFetch(`${designsPath(workspaceId)}?archived=${archived}`, { schema: designListSchema, signal }),
    select: (answer) => answer.designs,
    staleTime: staleTimes.sharedList,
    placeholderData: keepPreviousData,
  });
}

export function useDesign(workspaceId: number, designId: number | null) {
  return useQuery({
    queryKey: designKeys.detail(workspaceId, designId ?? -1),
    queryFn: ({ signal }) => apiFetch(`${designsPath(workspaceId)}/${designId}`, { schema: designDetailSchema, signal }),
    enabled: designId !== null,
    staleTime: staleTimes.sharedList,
  });
}

/** A saved version never changes. */
export function useDesignVersion(workspaceId: number, designId: number, number: number | null) {
  return useQuery({
    queryKey: designKeys.version(workspaceId, designId, number ?? -1),
    queryFn: ({ signal }) => apiFetch(`${designsPath(workspaceId)}/${designId}/versions/${number}`, { schema: designVersionResponseSchema, signal }),
    select: (answer) => answer.version,
    enabled: number !== null,
    staleTime: staleTimes.immutable,
  });
}

export function useCreateDesign(workspaceId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateDesignRequest) => apiFetch(designsPath(workspaceId), { method: 'POST', body, schema: designDetailSchema }),
    onSuccess: (detail) => {
      client.setQueryData(designKeys.detail(workspaceId, detail.design.id), detail);
      return client.invalidateQueries({ queryKey: designKeys.lists(workspaceId) });
    },
  });
}

/** Rename, archive or unarchive. */
export function useUpdateDesign(workspaceId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ designId, ...body }: UpdateDesignRequest & { designId: number }) =>
      apiFetch(`${designsPath(workspaceId)}/${designId}`, { method: 'PATCH', body, schema: designDetailSchema }),
    onSuccess: (detail) => {
      client.setQueryData(designKeys.detail(workspaceId, detail.design.id), detail);
      return client.invalidateQueries({ queryKey: designKeys.lists(workspaceId) });
    },
  });
}

/** Saves the spec; the server makes a new draft version only when it changed. */
export function useSaveSpec(workspaceId: number, designId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (spec: DesignSpecInput) =>
      apiFetch(`${designsPath(workspaceId)}/${designId}/spec`, { method: 'PUT', body: { spec }, schema: saveSpecResponseSchema }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: designKeys.detail(workspaceId, designId) }),
        client.invalidateQueries({ queryKey: designKeys.lists(workspaceId) }),
      ]),
  });
}

/** `value`, once it has stopped changing for `delayMs`. */
export function useDebouncedValue<T>(value: T, delayMs: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const id = setTimeout(() => setSettled(value), delayMs);
    return () => clearTimeout(id);
  }, [value, delayMs]);
  return settled;
}

/**
 * Live analysis: the compute request for `body` (null while the form is incomplete),
 * debounced, keeping the previous answer on screen while the next one is computed.
 */
export function useDiscretize(body: DiscretizeRequestBody | null) {
  const key = body ? JSON.stringify(body) : null;
  const settledKey = useDebouncedValue(key, ANALYSIS_DEBOUNCE_MS);
  const settled = settledKey ? (JSON.parse(settledKey) as DiscretizeRequestBody) : null;
  return useQuery({
    queryKey: settled ? discretizeKeys.request(settled) : [...discretizeKeys.all, 'idle'],
    // series packed (bit-exact float64, ~30 % smaller, far cheaper for the server to write);
    // the shared schema parses them back to numbers
    queryFn: ({ signal }) =>
      apiFetch('/api/v1/discretize', { method: 'POST', body: { ...settled, seriesFormat: 'packed' }, schema: discretizeResponseSchema, signal }),
    enabled: settled !== null,
    placeholderData: keepPreviousData,
    staleTime: COMPUTE_STALE_MS,
    retry: false,
  });
}

/** Lead placement for a target ζ, ωn (stateless, nothing cached or invalidated): a mutation the user runs. */
export function useLeadPlacement() {
  return useMutation({
    mutationFn: (body: LeadPlacementRequestBody) => apiFetch('/api/v1/lead-placement', { method: 'POST', body, schema: leadPlacementResponseSchema }),
  });
}
