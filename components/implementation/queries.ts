import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  bundleFilesSchema,
  bundleResponseSchema,
  implementResponseSchema,
  type BundleInfo,
  type ImplementRequestBody,
} from '../../schemas/implementation-api';
import { API_BASE_URL, apiFetch, isApiRequestError } from '../data/api';
import { staleTimes } from '../data/query-client';
import { ANALYSIS_DEBOUNCE_MS, useDebouncedValue } from '../design/queries';

/**
 * Query keys and hooks of the implementation preview (POST /api/v1/implement) and of the
 * stored bundle of a design version (…/versions/:number/bundle, /bundle/files, /bundle.zip).
 */
export const implementKeys = {
  all: ['implement'] as const,
  /** the request body itself is the key: the preview is stateless */
  request: (body: ImplementRequestBody) => [...implementKeys.all, body] as const,
};

export const bundleKeys = {
  all: ['bundles'] as const,
  version: (workspaceId: number, designId: number, number: number) => [...bundleKeys.all, workspaceId, designId, number] as const,
  info: (workspaceId: number, designId: number, number: number) => [...bundleKeys.version(workspaceId, designId, number), 'info'] as const,
  files: (workspaceId: number, designId: number, number: number) => [...bundleKeys.version(workspaceId, designId, number), 'files'] as const,
};

/** The preview for a given body never changes. */
const PREVIEW_STALE_MS = Infinity;

const bundlePath = (workspaceId: number, designId: number, number: number) =>
  `/api/v1/workspaces/${workspaceId}/designs/${designId}/versions/${number}/bundle`;

/** The address the browser downloads the zip from (a plain link: the session cookie goes along). */
export function bundleZipUrl(workspaceId: number, designId: number, number: number): string {
  return `${API_BASE_URL}${bundlePath(workspaceId, designId, number)}.zip`;
}

/**
 * Live preview: the answer for `body` (null while the form does not validate), debounced,
 * keeping the previous answer on screen while the next one is computed.
 */
export function useImplementPreview(body: ImplementRequestBody | null) {
  const key = body ? JSON.stringify(body) : null;
  const settledKey = useDebouncedValue(key, ANALYSIS_DEBOUNCE_MS);
  const settled = settledKey ? (JSON.parse(settledKey) as ImplementRequestBody) : null;
  return useQuery({
    queryKey: settled ? implementKeys.request(settled) : [...implementKeys.all, 'idle'],
    queryFn: ({ signal }) => apiFetch('/api/v1/implement', { method: 'POST', body: settled, schema: implementResponseSchema, signal }),
    enabled: settled !== null,
    placeholderData: keepPreviousData,
    staleTime: PREVIEW_STALE_MS,
    retry: false,
  });
}

/** The stored bundle of a version, or null when none has been generated (404). A bundle never changes. */
export function useBundle(workspaceId: number, designId: number, number: number | null) {
  return useQuery({
    queryKey: bundleKeys.info(workspaceId, designId, number ?? -1),
    queryFn: async ({ signal }): Promise<BundleInfo | null> => {
      try {
        const answer = await apiFetch(bundlePath(workspaceId, designId, number!), { schema: bundleResponseSchema, signal });
        return answer.bundle;
      } catch (error) {
        if (isApiRequestError(error, 404)) return null;
        throw error;
      }
    },
    enabled: number !== null,
    // null (not generated yet) may change when a colleague generates it; a bundle never does
    staleTime: (query) => (query.state.data ? staleTimes.immutable : staleTimes.sharedList),
  });
}

/** The text of every file of the stored bundle. */
export function useBundleFiles(workspaceId: number, designId: number, number: number | null, enabled: boolean) {
  return useQuery({
    queryKey: bundleKeys.files(workspaceId, designId, number ?? -1),
    queryFn: ({ signal }) => apiFetch(`${bundlePath(workspaceId, designId, number!)}/files`, { schema: bundleFilesSchema, signal }),
    select: (answer) => answer.files,
    enabled: enabled && number !== null,
    staleTime: staleTimes.immutable,
  });
}

/** Generates (or finds: the route is idempotent) the bundle of a saved version. */
export function useGenerateBundle(workspaceId: number, designId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (number: number) => apiFetch(bundlePath(workspaceId, designId, number), { method: 'POST', schema: bundleResponseSchema }),
    onSuccess: ({ bundle }) => {
      client.setQueryData(bundleKeys.info(workspaceId, designId, bundle.versionNumber), bundle);
      return client.invalidateQueries({ queryKey: bundleKeys.files(workspaceId, designId, bundle.versionNumber) });
    },
  });
}
