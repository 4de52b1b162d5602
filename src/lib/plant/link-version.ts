/**
 * One version of a tag link in its three forms, its figures defined once: as the services read it
 * (instants as Date), as the plant API and the unit page answer it (instants as ISO 8601 text), and
 * as the engine takes it (src/lib/engine/types.ts EngineLink, instants in ms).
 */
import type { LinkQuantity, UnitKind } from './kinds';

/** What a link version says about its tag, whatever form its instants take. */
export interface LinkVersionFigures {
  /** null: a measurement of the unit itself (power) */
  portName: string | null;
  quantity: LinkQuantity;
  tagName: string;
  /** engineering unit of the tag ('barg', 'degC', 't/h' ...); convert with src/lib/units */
  engUnit: string;
  basis: 'dry' | 'wet' | null;
  /** 'absolute': in engUnit; 'relative': percent of reading */
  uncertaintyMode: 'absolute' | 'relative';
  uncertainty: number;
  /** valid range in engUnit; readings outside it are suspect */
  validMin: number | null;
  validMax: number | null;
}

/** A link version with the ids and names around it; `T` is the form of its instants. */
export interface LinkVersion<T = Date> extends LinkVersionFigures {
  id: string;
  unitId: string;
  unitName: string;
  unitKind: UnitKind;
  portId: string | null;
  portSlot: string | null;
  tagId: string;
  /** first instant the version holds */
  validFrom: T;
  /** first instant it no longer holds; null while current */
  validTo: T | null;
}

/** A link version as the plant API and the unit page answer it (JSON: instants as text). */
export type LinkVersionAnswer = LinkVersion<string>;

/** The version holds at `nowMs` (validFrom <= now < validTo). */
export function holdsNow(l: Pick<LinkVersionAnswer, 'validFrom' | 'validTo'>, nowMs = Date.now()): boolean {
  return Date.parse(l.validFrom) <= nowMs && (l.validTo === null || Date.parse(l.validTo) > nowMs);
}
