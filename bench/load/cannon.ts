// One autocannon load generator in its own process (so the generators of a phase do not share one thread with each other
// or with the benchmark's driver). Input: a JSON plan as the first argument. Output: one JSON line with the request
// count, non-2xx answers, errors and every answer as [finished at (ms since the epoch), response time (ms)]; the driver
// merges them and takes percentiles. SIGINT stops it early (the results so far are printed).
import autocannon from 'autocannon'

export interface CannonPlan {
  url: string
  connections: number
  seconds: number
  /** cycled over the requests: each request takes the next path and the next header set */
  paths: string[]
  headers: Record<string, string>[]
}
export interface CannonResult { total: number, non2xx: number, errors: number, seconds: number, answers: [number, number][] }

const plan = JSON.parse(process.argv[2]!) as CannonPlan
const answers: [number, number][] = []
let next = 0
const instance = autocannon({
  url: plan.url,
  connections: plan.connections,
  duration: plan.seconds,
  pipelining: 1,
  requests: [{
    setupRequest: (req) => {
      const i = next++
      return { ...req, method: 'GET', path: plan.paths[i % plan.paths.length]!, headers: { ...req.headers, ...plan.headers[i % plan.headers.length] } }
    },
  }],
}, (error, result) => {
  if (error) throw error
  const out: CannonResult = { total: result.requests.total, non2xx: result.non2xx, errors: result.errors + result.timeouts, seconds: result.duration, answers }
  process.stdout.write(`${JSON.stringify(out)}\n`)
})
instance.on('response', (_client, _status, _bytes, responseTime) => { answers.push([Date.now(), responseTime]) })
process.on('SIGINT', () => instance.stop())
