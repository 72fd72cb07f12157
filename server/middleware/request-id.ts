import { randomUUID } from 'node:crypto'

// Every request gets an id, echoed in the response and written into audit events.
export default defineEventHandler((event) => {
  const id = randomUUID()
  event.context.requestId = id
  setResponseHeader(event, 'x-request-id', id)
})
