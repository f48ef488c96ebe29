/** Next 16 hands dynamic segments to route handlers as a Promise. */
export interface RouteContext<P extends Record<string, string> = { id: string }> {
  params: Promise<P>;
}
