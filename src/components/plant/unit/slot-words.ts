/** How many ports of a slot a unit may have, in words: "exactly one", "one or more", "any number". */
export function slotCountWords(min: number, max: number | null): string {
  const n = (k: number) => ['none', 'one', 'two', 'three'][k] ?? String(k);
  if (max === null) return min === 0 ? 'any number' : `${n(min)} or more`;
  if (min === max) return `exactly ${n(min)}`;
  return min === 0 ? `at most ${n(max)}` : `${n(min)} to ${n(max)}`;
}
