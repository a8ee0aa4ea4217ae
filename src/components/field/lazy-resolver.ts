import type { FieldValues, Resolver } from "react-hook-form";
import type { z } from "zod";

/**
 * A zod resolver whose schema, zod and the resolver load with the form's first check rather
 * than with the screen (precached chunks, so offline too): the screen opens lighter.
 */
export function lazyZodResolver<T extends FieldValues>(load: () => Promise<z.ZodType<T, FieldValues>>): Resolver<T> {
  return async (values, context, options) => {
    const [{ zodResolver }, schema] = await Promise.all([import("@hookform/resolvers/zod"), load()]);
    return (zodResolver(schema as never) as unknown as Resolver<T>)(values, context, options);
  };
}
