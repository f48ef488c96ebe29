/** Plain, prefixed progress lines so the start and test output reads as one story. */
export function say(message: string): void {
  console.log(`[tautline] ${message}`);
}

export function warn(message: string): void {
  console.warn(`[tautline] warning: ${message}`);
}

export function errorMessage(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}
