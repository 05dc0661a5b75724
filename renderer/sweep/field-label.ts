// The label a form field shows: the member's words from the schema's `title` and the unit its
// key carries, "Length, m" for lengthM and "Young's modulus, Pa" for youngsModulusPa. A member
// with no title (a material's or channel's own name) shows its key, which is then the name the
// person wrote. The key itself is shown on hover, so the JSON text can still be searched for it.

/** "Words, unit"; dimensionless values ("1") and unitless members show the words alone. */
export function fieldLabel(key: string, title: unknown, unit: string | null): string {
  const words = typeof title === 'string' && title !== '' ? title : key;
  return unit !== null && unit !== '1' ? `${words}, ${unit}` : words;
}
