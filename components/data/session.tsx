import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';
import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { router } from 'expo-router';
import {
  sessionInfoSchema,
  type LoginRequest,
  type Membership,
  type Role,
  type SessionInfo,
  type User,
  type Workspace,
} from '../../schemas/auth';
import { ApiRequestError, apiFetch, isApiRequestError, setCsrfToken } from './api';
import { staleTimes } from './query-client';
import { loadWorkspaceId, saveWorkspaceId } from './workspace-storage';

/** Query keys of the signed-in session (GET /api/v1/auth/me). */
export const sessionKeys = {
  all: ['session'] as const,
  me: () => [...sessionKeys.all, 'me'] as const,
};

/** The session, or null when signed out (401 is an answer here, not an error). */
async function fetchSession(signal?: AbortSignal): Promise<SessionInfo | null> {
  try {
    const info = await apiFetch('/api/v1/auth/me', { schema: sessionInfoSchema, signal });
    setCsrfToken(info.csrfToken);
    return info;
  } catch (error) {
    if (isApiRequestError(error, 401)) {
      setCsrfToken(null);
      return null;
    }
    throw error;
  }
}

/** Drops everything cached for the previous user except the session entry itself. */
function forgetUserData(client: QueryClient): void {
  client.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.all[0] });
}

/** For createQueryClient(): a 401 anywhere means the session is gone; ask /auth/me again. */
export function handleUnauthorized(client: QueryClient): void {
  void client.invalidateQueries({ queryKey: sessionKeys.all });
}

export type SessionStatus = 'loading' | 'signed-out' | 'signed-in' | 'error';

export interface SessionValue {
  status: SessionStatus;
  session: SessionInfo | null;
  user: User | null;
  memberships: Membership[];
  /** set when /auth/me failed for a reason other than being signed out */
  error: ApiRequestError | Error | null;
  /** the membership the user is working in; null when signed out or a member of none */
  current: Membership | null;
  setWorkspaceId(id: number): void;
  refetch(): void;
}

const SessionContext = createContext<SessionValue | null>(null);

export function SessionProvider({ children }: { children: ReactNode }) {
  const query = useQuery({
    queryKey: sessionKeys.me(),
    queryFn: ({ signal }) => fetchSession(signal),
    staleTime: staleTimes.session,
  });
  const [chosenId, setChosenId] = useState<number | null>(() => loadWorkspaceId());

  const setWorkspaceId = useCallback((id: number) => {
    saveWorkspaceId(id);
    setChosenId(id);
  }, []);

  const session = query.data ?? null;
  const memberships = useMemo(() => session?.memberships ?? [], [session]);
  const current = useMemo(
    () => memberships.find((m) => m.workspace.id === chosenId) ?? memberships[0] ?? null,
    [memberships, chosenId],
  );

  let status: SessionStatus;
  if (query.isPending) status = 'loading';
  else if (query.isError && !session) status = 'error';
  else status = session ? 'signed-in' : 'signed-out';

  const { refetch } = query;
  const value = useMemo<SessionValue>(
    () => ({
      status,
      session,
      user: session?.user ?? null,
      memberships,
      error: query.error,
      current,
      setWorkspaceId,
      refetch: () => void refetch(),
    }),
    [status, session, memberships, query.error, current, setWorkspaceId, refetch],
  );
  return <SessionContext.Provider value={value}>{children}</SessionContext.Provider>;
}

/** The signed-in session (or its absence). Needs <SessionProvider> above it (app/_layout.tsx). */
export function useSession(): SessionValue {
  const value = useContext(SessionContext);
  if (!value) throw new Error('useSession() needs <SessionProvider> (app/_layout.tsx)');
  return value;
}

export interface CurrentWorkspace {
  workspace: Workspace;
  /** the signed-in user's role in this workspace */
  role: Role;
  /** switch workspace; remembered across reloads on the web */
  setWorkspaceId(id: number): void;
}

/**
 * The workspace the user is working in and their role there. Only for screens inside
 * app/(app)/: that layout guarantees a signed-in user with at least one membership.
 */
export function useCurrentWorkspace(): CurrentWorkspace {
  const { current, setWorkspaceId } = useSession();
  if (!current) throw new Error('useCurrentWorkspace() is for screens inside app/(app)/ only');
  return useMemo(
    () => ({ workspace: current.workspace, role: current.role, setWorkspaceId }),
    [current, setWorkspaceId],
  );
}

/** POST /api/v1/auth/login; on success the new session replaces whatever was cached. */
export function useSignIn() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: LoginRequest) =>
      apiFetch('/api/v1/auth/login', { method: 'POST', body, schema: sessionInfoSchema }),
    onSuccess: (info) => {
      setCsrfToken(info.csrfToken);
      forgetUserData(client);
      client.setQueryData(sessionKeys.me(), info);
    },
  });
}

/** POST /api/v1/auth/logout; a stale CSRF token is renewed through /auth/me and tried once more. */
export function useSignOut() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async () => {
      try {
        await apiFetch('/api/v1/auth/logout', { method: 'POST' });
      } catch (error) {
        if (isApiRequestError(error, 401)) return; // already signed out
        if (!isApiRequestError(error, 403)) throw error;
        const fresh = await fetchSession();
        if (!fresh) return;
        await apiFetch('/api/v1/auth/logout', { method: 'POST' });
      }
    },
    onSuccess: () => {
      setCsrfToken(null);
      // leave first, so the guard of app/(app) does not offer to come back here after the next sign-in
      router.replace('/sign-in');
      client.setQueryData(sessionKeys.me(), null);
      forgetUserData(client);
    },
  });
}
