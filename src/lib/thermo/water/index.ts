/**
 * Water and steam properties (IAPWS-IF97). Import `water` and the `WaterState` type from here.
 * @see IAPWS R7-97(2012)
 */
export { water } from './water';
export type { WaterPhase, WaterRegion, WaterState } from './water';
