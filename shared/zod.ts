import { z } from 'zod'

// The one import of zod for code that can run in the browser (shared schemas, pages, composables). zod's fast object
// parser compiles code with `new Function`, and even its probe for that is reported as a violation under our
// Content-Security-Policy (no 'unsafe-eval'). In the browser it runs without code generation; set before any schema
// is built, because zod decides when a schema is constructed. The server keeps the faster parser.
if ('window' in globalThis) z.config({ jitless: true })

export { z }
