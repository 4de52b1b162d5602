/**
 * The plant model, pure: the catalogue of unit kinds, the model file's schema and checks, the
 * completeness and conflict check of a unit, the standard atmosphere and default uncertainties.
 */
export * from './kinds';
export * from './model';
export * from './status';
export * from './atmosphere';
export * from './uncertainty';
export * from './tag-limits';
