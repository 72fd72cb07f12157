// A known /api/ address asked with a method it does not serve (DELETE /api/me) falls through h3's router to the page
// renderer, which would answer with the app's HTML: answer 405 JSON instead. Unknown /api/ addresses: server/api/[...path].ts.
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('render:before', (ctx) => {
    const path = ctx.event.path.split('?')[0]!
    if (path !== '/api' && !path.startsWith('/api/')) return
    const message = `${ctx.event.method} is not served at ${path}.`
    ctx.response = {
      statusCode: 405,
      statusMessage: 'Method Not Allowed',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(apiErrorBody(405, 'method-not-allowed', message)),
    }
  })
})
