import type { LinkQuantity } from '~/lib/plant/kinds';
import type { DisplayUnits } from '~/lib/units/display';
import type { TagJson, UnitJson } from '../LinkForm';

/** One version of a tag link of the unit, as the unit's API answers it. */
export interface LinkRow {
  id: string;
  portId: string | null;
  portName: string | null;
  quantity: LinkQuantity;
  tagName: string;
  engUnit: string;
  basis: 'dry' | 'wet' | null;
  uncertaintyMode: 'absolute' | 'relative';
  uncertainty: number;
  validMin: number | null;
  validMax: number | null;
  validFrom: string;
  validTo: string | null;
}

/** What the unit page hands its island. */
export interface UnitPageData {
  site: { id: string; name: string; timeZone: string };
  unit: UnitJson;
  history: LinkRow[];
  tags: TagJson[];
  boilers: string[];
  prices: string[];
  /** The site's display units; parameters of power, mass flow and temperature are shown in them. */
  display?: DisplayUnits;
}

/** Which link form is open: a target to fill, a tag or unit to start from, or a change of a link. */
export interface LinkFormState {
  target?: string;
  tag?: string;
  unit?: string;
  changing?: boolean;
  key: number;
}

/** The link version holds at `now`. */
export const holdsNow = (l: LinkRow, now = Date.now()) => Date.parse(l.validFrom) <= now && (l.validTo === null || Date.parse(l.validTo) > now);

/** The grid of a form: as many columns as fit, none narrower than a select's longest words. */
export const FORM_GRID = 'grid gap-3 sm:grid-cols-2 lg:grid-cols-3';
