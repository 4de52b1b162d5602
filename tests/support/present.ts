/**
 * Reads that must find something. With `noUncheckedIndexedAccess` an index or key lookup may be
 * `undefined`; in a test a missing item is a failure, so these throw a message that names what was
 * looked for instead of letting `undefined` run on into a confusing error (or a silent pass).
 */

/**
 * Item `index` of an array or typed array. A negative index is refused rather than counted from the
 * end, so that an `indexOf` that found nothing (-1) fails here instead of reading the last item.
 */
export function at<T>(items: ArrayLike<T>, index: number, what = 'list'): T {
  if (!Number.isInteger(index) || index < 0 || index >= items.length) {
    throw new Error(`${what}: no item at index ${index} (it has ${items.length})`);
  }
  return items[index] as T;
}

/** Cell [row][col] of a list of rows (a matrix). */
export function cell<T>(rows: ArrayLike<ArrayLike<T>>, row: number, col: number, what = 'matrix'): T {
  return at(at(rows, row, what), col, `${what} row ${row}`);
}

/** The value under `key` of a record or map-like object, which must be there. */
export function entry<T>(record: Readonly<Record<string, T | undefined>>, key: string, what = 'record'): T {
  const v = record[key];
  if (v === undefined) {
    const keys = Object.keys(record);
    throw new Error(`${what}: no entry "${key}" (it has ${keys.length ? keys.map((k) => `"${k}"`).join(', ') : 'none'})`);
  }
  return v;
}

/** A value that must be there (a find, a regular-expression group, a first row). `null` counts as present. */
export function defined<T>(value: T | undefined, what: string): T {
  if (value === undefined) throw new Error(`${what}: missing`);
  return value;
}
