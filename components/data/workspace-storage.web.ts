/** Web: the current workspace survives reloads and new tabs through localStorage. */
const KEY = 'samplewright.workspaceId';

export function loadWorkspaceId(): number | null {
  try {
    const raw = globalThis.localStorage?.getItem(KEY);
    const id = raw === null || raw === undefined ? NaN : Number(raw);
    return Number.isInteger(id) && id > 0 ? id : null;
  } catch {
    return null; // storage disabled (private mode, sandboxed frame)
  }
}

export function saveWorkspaceId(id: number | null): void {
  try {
    if (id === null) globalThis.localStorage?.removeItem(KEY);
    else globalThis.localStorage?.setItem(KEY, String(id));
  } catch {
    // storage disabled: the choice lasts for this page only
  }
}
