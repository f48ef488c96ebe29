// The parts of autocannon's API that scripts/load.ts uses (the package ships no types).
declare module "autocannon" {
  import type { EventEmitter } from "node:events";
  interface Request {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    timeout?: number;
    headers?: Record<string, string>;
    requests?: Request[];
  }
  export interface Result {
    requests: { average: number; total: number };
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
  }
  interface Instance extends EventEmitter {
    stop(): void;
  }
  function autocannon(opts: Options, cb: (err: Error | null, result: Result) => void): Instance;
  export default autocannon;
}
