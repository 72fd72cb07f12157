// The part of autocannon 9's API the load benchmark uses (the package ships no types).
declare module 'autocannon' {
  interface Request { method?: string, path?: string, headers?: Record<string, string>, body?: string }
  interface Options {
    url: string
    connections?: number
    duration?: number
    pipelining?: number
    requests?: { setupRequest?: (req: Request) => Request }[]
  }
  interface Result { requests: { total: number, average: number }, non2xx: number, errors: number, timeouts: number, duration: number }
  interface Instance { on(event: 'response', listener: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): void, stop(): void }
  function autocannon(options: Options, done: (error: Error | null, result: Result) => void): Instance
  export default autocannon
}
