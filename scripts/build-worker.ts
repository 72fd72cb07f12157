// Bundles the worker threads' entry (server/lib/work/worker.ts: the engine, import parsing, signing, exceljs and all)
// into one ES module with esbuild. Called by the build hook in nuxt.config.ts (into .output/server/workers/, beside the
// Nitro server, and into .nuxt/workers/ for `nuxt dev`) and by the unit tests of the pool.
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { build, type Plugin } from 'esbuild'

export const WORKER_BUNDLE = 'knotwork-worker.mjs'
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..')

/** Nuxt's aliases, as the app resolves them: #shared/... and ~~/... */
const aliases: Plugin = {
  name: 'knotwork-aliases',
  setup(b) {
    b.onResolve({ filter: /^(#shared|~~)\// }, async (args) => {
      const target = args.path.startsWith('#shared/') ? path.join(root, 'shared', args.path.slice('#shared/'.length)) : path.join(root, args.path.slice(3))
      const resolved = await b.resolve(`./${path.relative(args.resolveDir, target)}`, { resolveDir: args.resolveDir, kind: args.kind })
      return resolved.errors.length ? { errors: resolved.errors } : { path: resolved.path }
    })
  },
}

/** Writes <outDir>/knotwork-worker.mjs; returns its path. */
export async function buildWorker(outDir: string, options: { minify?: boolean } = {}): Promise<string> {
  const outfile = path.join(outDir, WORKER_BUNDLE)
  await build({
    entryPoints: [path.join(root, 'server/lib/work/worker.ts')],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    minify: options.minify ?? false,
    // CommonJS packages inside an ES module bundle (exceljs and its helpers) call require() for Node's own modules
    banner: { js: 'import { createRequire as __kwCreateRequire } from \'node:module\'; const require = __kwCreateRequire(import.meta.url);' },
    plugins: [aliases],
    logLevel: 'warning',
    legalComments: 'none',
  })
  return outfile
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const out = process.argv[2] ?? path.join(root, '.output/server/workers')
  buildWorker(out).then(f => console.log(`[worker] ${f}`), (e) => { console.error(e); process.exit(1) })
}
