// Caps the browser also needs (server/lib/import/limits.ts holds the rest).
export const IMPORT_COLUMNS_CAP = 64
export const IMPORT_UPLOAD_BYTES = 20 * 1024 * 1024
