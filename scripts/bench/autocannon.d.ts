// The few parts of autocannon the load bench uses (the package ships no types; @types is not installed).
declare module "autocannon" {
  type Options = { url: string; connections?: number; duration?: number; headers?: Record<string, string> };
  type Result = { requests: { average: number }; errors: number; timeouts: number; non2xx: number };
  type Instance = PromiseLike<Result> & { on(event: "response", f: (client: unknown, status: number, bytes: number, ms: number) => void): void };
  export default function autocannon(options: Options): Instance;
}
