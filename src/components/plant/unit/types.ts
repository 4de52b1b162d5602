import type { LinkVersionAnswer } from '~/lib/plant/link-version';
import type { DisplayUnits } from '~/lib/units/display';
import type { TagJson, UnitJson } from '../LinkForm';

/** What the unit page hands its island. */
export interface UnitPageData {
  site: { id: string; name: string; timeZone: string };
  unit: UnitJson;
  history: LinkVersionAnswer[];
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

/** The grid of a form: as many columns as fit, none narrower than a select's longest words. */
export const FORM_GRID = 'grid gap-3 sm:grid-cols-2 lg:grid-cols-3';
