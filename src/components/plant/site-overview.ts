import type { SiteModel } from '~/lib/plant/model';
import type { DisplayUnits } from '~/lib/units/display';
import type { UnitJson } from './LinkForm';

/** What GET /api/sites/{siteId} answers, and the plant page hands SitePanel. */
export interface Overview {
  site: { id: string; name: string; timeZone: string };
  settings: SiteModel;
  display: { units: DisplayUnits; chosen: boolean };
  units: UnitJson[];
}
