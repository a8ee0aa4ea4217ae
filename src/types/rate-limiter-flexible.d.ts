// The in-memory limiter and its result, imported from their own files: the package's index
// also loads its database-backed limiters, one of which requires by expression (a build warning).
declare module "rate-limiter-flexible/lib/RateLimiterMemory" {
  import { RateLimiterMemory } from "rate-limiter-flexible";
  export default RateLimiterMemory;
}
declare module "rate-limiter-flexible/lib/RateLimiterRes" {
  import { RateLimiterRes } from "rate-limiter-flexible";
  export default RateLimiterRes;
}
