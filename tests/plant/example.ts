import { readFileSync } from 'node:fs';
import type { PlantModel } from '~/lib/plant';

/** The complete example of docs/plant-model.md. */
export function documentedExample(): PlantModel {
  const md = readFileSync('docs/plant-model.md', 'utf8');
  const blocks = [...md.matchAll(/```json\n([\s\S]*?)```/g)].map((m) => m[1]!);
  const example = blocks.find((b) => b.includes('"lossline-plant-model"'));
  if (!example) throw new Error('docs/plant-model.md has no example model');
  return JSON.parse(example);
}

