/** The object without its undefined fields (zod leaves absent optional fields undefined; updates must skip them). */
export function definedOnly<T extends object>(value: T): { [K in keyof T]?: Exclude<T[K], undefined> } {
  return Object.fromEntries(Object.entries(value).filter(([, field]) => field !== undefined)) as { [K in keyof T]?: Exclude<T[K], undefined> };
}
