/**
 * Where the id of the workspace the user last chose is remembered.
 * Native keeps it for the life of the process; the web build uses
 * localStorage (workspace-storage.web.ts).
 */
let remembered: number | null = null;

export function loadWorkspaceId(): number | null {
  return remembered;
}

export function saveWorkspaceId(id: number | null): void {
  remembered = id;
}
