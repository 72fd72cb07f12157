export default defineNitroPlugin((nitro) => {
  // Set the models up at start (synchronous; no connection opens before the first query), so a handler may use a model
  // before anything has called useDb(): a fresh server's first request used to fail when it was such a handler.
  if (useRuntimeConfig().databaseUrl) useDb()
  nitro.hooks.hook('close', () => closeDb())
})
