/**
 * Where to go after signing in: the `next` search parameter when it is a path inside
 * this app, else the overview. "//host", "/\\host" and absolute URLs are refused.
 * Example: safeReturnPath('/members') === '/members'; safeReturnPath('//evil.example') === '/'.
 */
export function safeReturnPath(next: string | string[] | undefined): string {
  const value = Array.isArray(next) ? next[0] : next;
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return '/';
  if (value === '/sign-in' || value.startsWith('/sign-in?') || value.startsWith('/sign-in/')) return '/';
  return value;
}
