import { defineConfig } from 'vitest/config'

// unit: engine and pure code. api: handlers against the built server and a real PostgreSQL
// (scripts/test.sh starts both and sets KW_BASE_URL / KW_DATABASE_OWNER_URL).
export default defineConfig({
  test: {
    projects: [
      { test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', testTimeout: 60_000 } },
      { test: { name: 'api', include: ['tests/api/**/*.test.ts'], environment: 'node', testTimeout: 60_000, hookTimeout: 60_000, fileParallelism: false } },
    ],
  },
})
