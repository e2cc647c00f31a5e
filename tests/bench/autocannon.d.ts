// The part of autocannon 8's programmatic API the load bench uses (the package ships no types).
declare module 'autocannon' {
  export interface AutocannonRequest {
    method?: string
    path?: string
    headers?: Record<string, string>
    body?: string | Buffer
    setupRequest?: (request: AutocannonRequest, context: Record<string, unknown>) => AutocannonRequest | null
  }
  interface AutocannonOptions {
    url: string
    connections?: number
    duration?: number
    timeout?: number
    pipelining?: number
    method?: string
    headers?: Record<string, string>
    body?: string
    requests?: AutocannonRequest[]
  }
  interface Histogram { average: number, mean: number, stddev: number, min: number, max: number, p50: number, p90: number, p97_5: number, p99: number }
  export interface AutocannonResult {
    duration: number
    requests: Histogram & { total: number, sent: number }
    latency: Histogram
    errors: number
    timeouts: number
    non2xx: number
    resets: number
    '2xx': number
    statusCodeStats: Record<string, { count: number }>
  }
  interface Instance extends PromiseLike<AutocannonResult> { stop: () => void }
  function autocannon(options: AutocannonOptions): Instance
  export default autocannon
}
