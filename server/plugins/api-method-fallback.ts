// A known /api/ address asked with a method it does not serve (DELETE /api/me) falls through h3's router to the page
// renderer, which would answer with the app's HTML: answer 405 JSON instead. Unknown /api/ addresses: server/api/[...path].ts.
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('render:before', (ctx) => {
    const path = ctx.event.path.split('?')[0]!
    if (path !== '/api' && !path.startsWith('/api/')) return
    // /api itself is not under the catch-all (/api/**): nothing is served there
    const body = path === '/api'
      ? apiErrorBody(404, 'not-found', 'No such API address: /api.')
      : apiErrorBody(405, 'method-not-allowed', `${ctx.event.method} is not served at ${path}.`)
    ctx.response = { statusCode: body.statusCode, statusMessage: path === '/api' ? 'Not Found' : 'Method Not Allowed', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }
  })
})
