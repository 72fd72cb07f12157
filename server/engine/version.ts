/** Version of the numerical engine. Recorded in every resolved spec; bump it whenever any output digit could change. */
export const ENGINE_VERSION = '1.5.0'
