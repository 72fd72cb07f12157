import { writeDueCheckpoints } from '../services/audit-anchor'

// At least one signed checkpoint of each organisation's audit trail a day (besides one at every sign-off and the lazy one
// on the first audit read of a day): every ten minutes, organisations whose trail grew since their last checkpoint and
// that have none for today get one. Idempotent in PostgreSQL (one daily checkpoint per organisation and UTC day), so
// several app nodes sharing the database may all run it. Timers are unref'd: they never keep the process alive.
const EVERY_MS = 10 * 60_000

export default defineNitroPlugin((nitro) => {
  const run = () => { writeDueCheckpoints().catch((error: Error) => console.error(`[audit] daily checkpoints: ${error.message}`)) }
  const first = setTimeout(run, 60_000)
  const timer = setInterval(run, EVERY_MS)
  first.unref?.()
  timer.unref?.()
  nitro.hooks.hook('close', () => { clearTimeout(first); clearInterval(timer) })
})
