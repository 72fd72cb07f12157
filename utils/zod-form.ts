import type { TypedSchema } from 'vee-validate'
import type { z } from 'zod'

/**
 * vee-validate's typed-schema contract for a zod 4 schema (@vee-validate/zod only
 * supports zod 3). The same schema object validates on the server.
 */
export function zodFormSchema<S extends z.ZodType>(schema: S): TypedSchema<z.input<S>, z.output<S>> {
  return {
    __type: 'VVTypedSchema',
    async parse(values) {
      const result = await schema.safeParseAsync(values)
      if (result.success) return { value: result.data, errors: [] }
      const byPath = new Map<string, string[]>()
      for (const issue of result.error.issues) {
        const path = issue.path.map(String).join('.')
        byPath.set(path, [...(byPath.get(path) ?? []), issue.message])
      }
      return { errors: [...byPath].map(([path, errors]) => ({ path, errors })) }
    },
  }
}
