// Caps that keep a hostile or oversized spreadsheet from exhausting the server.
// Each one has a test in tests/api/import-limits.test.ts.
import { IMPORT_CELLS_CAP, IMPORT_COLUMNS_CAP, IMPORT_ROWS_CAP, IMPORT_UPLOAD_BYTES } from '#shared/import-caps'

export const IMPORT_LIMITS = {
  /** request body bytes, counted as they arrive (never taken from Content-Length) */
  uploadBytes: IMPORT_UPLOAD_BYTES,
  /** entries in an .xlsx zip */
  zipEntries: 2_000,
  /** declared uncompressed size of one zip entry, and of all entries together */
  entryBytes: 150 * 1024 * 1024,
  totalInflatedBytes: 300 * 1024 * 1024,
  /** declared uncompressed / compressed, for entries above 1 MiB uncompressed */
  compressionRatio: 120,
  rows: IMPORT_ROWS_CAP,
  columns: IMPORT_COLUMNS_CAP,
  /** rows x columns over all sheets */
  cells: IMPORT_CELLS_CAP,
  /** an upload's parsed cells are kept this long for the wizard steps */
  keepHours: 24,
} as const

/** A refusal that the route turns into a 4xx with this message. */
export class ImportRefused extends Error {
  constructor(readonly statusCode: 400 | 413 | 415 | 422, message: string) {
    super(message)
  }
}
