/** Bundle generation timing; filled in when server/codegen lands. */
export async function benchBundle(): Promise<{ median: number; p95: number; n: number } | null> {
  return null;
}
