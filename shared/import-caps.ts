// Caps the browser also needs (server/lib/import/limits.ts holds the rest; docs/reliability.md lists them all).
export const IMPORT_COLUMNS_CAP = 64
export const IMPORT_ROWS_CAP = 200_000
export const IMPORT_UPLOAD_BYTES = 20 * 1024 * 1024
/** rows x columns of every sheet of one upload, added up: bounds the work of reading, storing and checking it */
export const IMPORT_CELLS_CAP = 1_000_000
/** value columns of one import (each becomes its own table with a working draft) */
export const IMPORT_VALUE_COLUMNS_CAP = 32
/** imports being read, checked or created at once by one person (429 with Retry-After beyond) */
export const IMPORT_CONCURRENT_PER_PERSON = 2
