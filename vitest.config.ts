import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const root = fileURLToPath(new URL('.', import.meta.url))

// unit: engine and pure code. api: handlers against the built server and a real PostgreSQL
// (scripts/test.sh starts both and sets KW_BASE_URL / KW_DATABASE_OWNER_URL). nodes: two app nodes on one database.
// reliability: its own PostgreSQL cluster and app server (tests/reliability/setup.ts), which its tests kill and
// restart; files run one after another.
// The aliases are Nuxt's own (#shared, ~~), so tests import code the way the app does.
export default defineConfig({
  resolve: { alias: { '#shared': `${root}shared`, '~~': root.replace(/\/$/, ''), '~': root.replace(/\/$/, '') } },
  test: {
    projects: [
      { extends: true, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', testTimeout: 60_000 } },
      { extends: true, test: { name: 'api', include: ['tests/api/**/*.test.ts'], setupFiles: ['tests/api/setup.ts'], environment: 'node', testTimeout: 60_000, hookTimeout: 60_000, fileParallelism: false } },
      { extends: true, test: { name: 'reliability', include: ['tests/reliability/**/*.test.ts'], globalSetup: ['tests/reliability/setup.ts'], setupFiles: ['tests/api/setup.ts'], environment: 'node', testTimeout: 300_000, hookTimeout: 300_000, fileParallelism: false } },
      // two app nodes of the built server started by the test itself (scripts/test.sh runs it before its own server starts)
      { extends: true, test: { name: 'nodes', include: ['tests/nodes/**/*.test.ts'], setupFiles: ['tests/api/setup.ts'], environment: 'node', testTimeout: 300_000, hookTimeout: 120_000, fileParallelism: false } },
    ],
  },
})
