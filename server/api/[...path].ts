// Any /api/... address that no route serves: 404 JSON with a code, never the app's HTML page (which would answer 200),
// whatever the client accepts. A known address asked with another method: server/plugins/api-method-fallback.ts.
export default defineEventHandler((event) => {
  const message = `No such API address: ${event.path.split('?')[0]}.`
  setResponseStatus(event, 404, 'Not Found')
  return apiErrorBody(404, 'not-found', message)
})
