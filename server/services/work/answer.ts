import type { H3Event } from 'h3'
import type { RunDto, RunStatus } from '#shared/types/runs'
import type { OrgAccess } from '../../utils/auth'
import { onRunEvent } from './listener'
import { cancelRun, findRun, runOutcome, runStatusById } from './runs'
import { throwRunError } from './errors'

const FINAL: RunStatus[] = ['done', 'failed', 'cancelled']

/** Resolves when the run has ended, on whichever node it ran: woken by NOTIFY, and looking at the row every second. */
export function awaitRun(id: string): Promise<RunStatus> {
  return new Promise((resolve) => {
    let settled = false
    const look = () => runStatusById(id).then((s) => {
      if (!s || !FINAL.includes(s) || settled) return
      settled = true
      off()
      clearInterval(timer)
      resolve(s)
    }, () => {})
    const off = onRunEvent(id, (what) => { if (what !== 'cancel') void look() })
    const timer = setInterval(look, 1000)
    void look()
  })
}

/**
 * The answer to a request that started a run. With `Prefer: respond-async`, 202 at once with the run (follow it on any
 * node: GET .../runs/<id>, then .../runs/<id>/result). Otherwise the request waits for the run and answers its result
 * (`okStatus`) or its refusal; if the connection closes first, the run is cancelled, wherever it runs.
 */
export async function answerRun(event: H3Event, access: OrgAccess, run: { id: string, runKey: string }, okStatus = 200): Promise<string | Buffer | RunDto> {
  if (/\brespond-async\b/i.test(getRequestHeader(event, 'prefer') ?? '')) {
    setResponseStatus(event, 202)
    setResponseHeader(event, 'location', `/api/orgs/${access.org.slug}/runs/${run.runKey}`)
    return (await findRun(access, run.runKey)).dto
  }
  const res = event.node.res
  const onClose = () => { if (!res.writableEnded) void cancelRun(run.id).catch(() => {}) }
  res.once('close', onClose)
  const status = await awaitRun(run.id).finally(() => res.off('close', onClose))
  if (status === 'cancelled') throw apiError(499, 'cancelled', 'The run was cancelled.')
  return sendOutcome(event, run.id, okStatus)
}

/** A finished run's stored answer as it is (JSON text, never parsed here; or a file), or the refusal it ended with. */
export async function sendOutcome(event: H3Event, id: string, okStatus = 200): Promise<string | Buffer> {
  const outcome = await runOutcome(id)
  if (outcome.status === 'failed') throwRunError(outcome.error)
  if (outcome.status === 'cancelled') throw apiError(409, 'cancelled', 'The run was cancelled; it has no result.')
  if (outcome.status !== 'done' || outcome.result === null) throw apiError(409, 'run-unfinished', 'The run has not finished yet; ask again shortly.', { status: outcome.status })
  setResponseStatus(event, okStatus)
  if (outcome.result_bytes) {
    const { file } = JSON.parse(outcome.result) as { file: { name: string, type: string } }
    setResponseHeaders(event, { 'content-type': file.type, 'content-disposition': `attachment; filename="${file.name}"`, 'cache-control': 'no-store' })
    return outcome.result_bytes
  }
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return outcome.result
}
