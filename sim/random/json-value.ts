// The type of any value a scenario file can hold, so that choice specs and sampled labels can
// carry strings, flags or small objects as well as numbers without falling back to `unknown`.

export type JsonValue = string | number | boolean | null | JsonValue[] | { [key: string]: JsonValue };
