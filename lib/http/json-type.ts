/** A server value as it arrives through JSON: dates become ISO strings (response types shared with the client). Arrays and tuples keep their shape. */
export type Jsonified<T> = T extends Date ? string : T extends object ? { [K in keyof T]: Jsonified<T[K]> } : T;
