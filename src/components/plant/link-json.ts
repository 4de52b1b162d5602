import type { UnitKind } from '~/lib/kinds';
import type { LinkModel, PortModel } from '~/lib/plant/model';
import type { UnitStatus } from '~/lib/plant/status';

/** A unit as the plant endpoints answer it, with its ports, links and status (the link form and the unit page). */
export interface UnitJson {
  id: string;
  name: string;
  kind: UnitKind;
  description?: string;
  parameters: Record<string, number | string>;
  fuel?: unknown;
  ports: (PortModel & { id: string })[];
  links: LinkModel[];
  status: UnitStatus;
}

/** A tag as the plant endpoints answer it. */
export interface TagJson {
  id: string;
  name: string;
  unitHint: string | null;
  description?: string | null;
}
