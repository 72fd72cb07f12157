// Strict-Transport-Security on every answer served over HTTPS (browsers ignore it over plain HTTP, and dev and tests run
// on http://127.0.0.1). Set when the request arrives, so refusals and errors carry it too. One year, subdomains included.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    if (servedOverHttps(event)) setResponseHeader(event, 'strict-transport-security', 'max-age=31536000; includeSubDomains')
  })
})
