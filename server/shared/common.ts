import { z } from 'zod';

/** A numeric row id in a path (`/api/sites/:id`). */
export const idParams = z.object({ id: z.coerce.number().int().positive() });

/**
 * The list conventions of DESIGN.md: `page` (1-based), `pageSize`, `sort` (`field` or `-field`).
 * Each resource extends this with its filters and narrows `sort` to its sortable fields.
 */
export function listQuery<const Fields extends readonly [string, ...string[]]>(sortable: Fields, defaultSort: string) {
  const sortValues = sortable.flatMap((field) => [field, `-${field}`]) as [string, ...string[]];
  return z.object({
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(500).default(25),
    sort: z.enum(sortValues).default(defaultSort),
  });
}

/** `{ items, total, page, pageSize }` around an item schema. */
export function listOf<Item extends z.ZodType>(item: Item) {
  return z.object({
    items: z.array(item),
    total: z.number().int(),
    page: z.number().int(),
    pageSize: z.number().int(),
  });
}

export interface ListResult<Item> {
  items: Item[];
  total: number;
  page: number;
  pageSize: number;
}

/** The one error body: `{ error: { code, message, details } }`. */
export const errorBody = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ErrorBody = z.infer<typeof errorBody>;

/** ISO 4217 currency code. */
export const currencyCode = z.string().regex(/^[A-Z]{3}$/, 'must be a three-letter ISO 4217 code such as EUR');

/** Optimistic-locking version a client sends back with an edit. */
export const versionField = z.number().int().min(0);
