/**
 * Words for the codes Lossline keeps in the API and the database: reasons of hour states, problems of
 * the engine and the plant model, refusals of balances, units and files, and the API's error codes.
 * The API answers the codes; every screen, mail and report for people shows these words.
 * tests/words/catalogue.test.ts reads the source lists and fails when a code has no entry here.
 */
import { code, type WordEntry } from './types';

/** Reasons of an hour's state (src/lib/analytics/steady.ts, HourReasonCode). */
export const HOUR_REASON_WORDS = {
  TAG_MISSING: code('no value from a key tag', 'A tag the balance needs has no usable value in this hour.'),
  TAG_FROZEN: code('frozen tag', 'A tag kept one value longer than its flatline limit; the transmitter may be stuck.'),
  TAG_OUT_OF_RANGE: code('tag outside its valid range', 'Samples of a tag lie outside the range set on its link.'),
  TAG_POOR_COVERAGE: code('too few samples in the hour', 'The samples of a tag cover too little of the hour to trust its mean.'),
  TAG_STATUS_WORDS: code('status words instead of numbers', 'The historian wrote status words in place of values for part of the hour.'),
  BALANCE_NOT_CLOSED: code('balance does not close', 'Mass or energy in and out differ by more than the tolerance: a meter may be off.'),
  BELOW_MIN_LOAD: code('below the minimum load', 'The unit ran under its minimum load, so the hour counts as idle.'),
  SPREAD_HIGH: code('spread too wide', 'A key tag moved more within the hour than the spread limit allows, so the hour is not steady.'),
} as const satisfies Record<string, WordEntry>;

/** Problems the engine records on an hour or a unit (src/lib/engine). */
export const ENGINE_PROBLEM_WORDS = {
  LINK_MISSING: code('a measurement is not linked', 'The unit needs a tag for this measurement; link one in the plant model.'),
  MODEL_INCOMPLETE: code('plant model incomplete', 'The unit lacks a port, fluid, fuel or parameter it needs; complete it in the plant model.'),
  CONVERSION_FAILED: code('unit of a tag cannot be converted', "The tag's engineering unit does not convert to what the link measures; correct the tag's unit."),
  BALANCE_FAILED: code('balance cannot be formed', "The hour's values do not give a balance; the sentence beside it says which value."),
  ENTROPY_CHECK_FAILED: code('entropy check failed', 'Destruction and entropy generation disagree by more than the tolerance: the data are inconsistent.'),
  NEAR_SATURATION: code('steam near saturation', 'Pressure and temperature lie so close to saturation that the steam may be wet and its state unknown.'),
  BELOW_DEAD_STATE: code('stream colder than the surroundings', 'A stream is below the dead-state temperature, where this kind of unit has no clear fuel and product.'),
  NEGATIVE_DESTRUCTION: code('negative destruction', 'The balance gives less than zero destruction, which no real process does: the data are inconsistent.'),
  EFFICIENCY_ABOVE_ONE: code('efficiency above 100 %', 'More power comes out than goes in: a meter is off.'),
} as const satisfies Record<string, WordEntry>;

/** Why a balance was refused (src/lib/equipment/errors.ts, BalanceErrorCode). */
export const BALANCE_ERROR_WORDS = {
  MISSING_INPUT: code('a value is missing', 'A port, power or parameter the balance needs has no value this hour.'),
  IMPOSSIBLE_INPUT: code('an impossible value', 'A value lies outside what is physically possible (a negative flow, an efficiency above one).'),
  INVALID_MODEL: code('model does not fit the kind', 'The ports or roles of the unit do not fit its kind of equipment.'),
  UNSOLVABLE: code('balance cannot be solved', 'The energy balance cannot fix an unknown flow or state from the values given.'),
} as const satisfies Record<string, WordEntry>;

/** What a unit of the plant model still lacks or where its links conflict (src/lib/plant/status.ts). */
export const PLANT_STATUS_WORDS = {
  MISSING_PORT: code('a port is missing', 'The kind of unit needs more ports than it has.'),
  MISSING_FLUID: code('fluid not set', 'A port does not say which fluid it carries.'),
  MISSING_MEASUREMENT: code('measurement not linked', 'A measurement the unit needs has no tag linked.'),
  MISSING_PARAMETER: code('parameter not set', 'A parameter the unit needs has no value.'),
  MISSING_FUEL: code('fuel not defined', 'The unit burns fuel but has no fuel definition.'),
  MISSING_BOUNDARY_T: code('boundary temperature missing', 'A heat port needs a boundary temperature, linked or fixed.'),
  MISSING_FUEL_SOURCE: code('flue gas without its boiler', "A flue-gas port does not say which boiler's fuel makes it."),
  TAG_ON_TWO_QUANTITIES: code('one tag, two measurements', 'The same tag is linked as two different measurements.'),
  TAG_HINT_OTHER_QUANTITY: code('tag seems to measure something else', "The tag's name or unit suggests another measurement than the one linked."),
  UNIT_CANNOT_CONVERT: code('unit of a tag cannot be converted', "The tag's engineering unit does not convert to what the link measures."),
  UNIT_DIFFERS_FROM_HINT: code('unit differs from the export', 'The unit set on the link differs from the unit the export gave for the tag.'),
  DUPLICATE_MEASUREMENT: code('measurement linked twice', 'The same measurement has more than one tag linked; keep one.'),
  LINK_NOT_IN_CATALOGUE: code('link the kind does not use', 'A link measures something the kind of unit does not use.'),
} as const satisfies Record<string, WordEntry>;

/** Refusals of the unit layer (src/lib/units/errors.ts, UnitErrorCode). */
export const UNIT_ERROR_WORDS = {
  UNKNOWN_UNIT: code('unknown unit', 'The unit text is not one Lossline knows; choose one of the spellings offered.'),
  UNKNOWN_QUANTITY: code('unknown measurement', 'The measurement named is not one Lossline knows.'),
  WRONG_QUANTITY: code('unit of another measurement', 'The unit belongs to another kind of measurement than the one asked for.'),
  MISSING_CONTEXT: code('site value missing', 'Converting this unit needs a site value (atmospheric pressure, gas density) that is not set.'),
  INVALID_ARGUMENT: code('value cannot be converted', 'The value given cannot be converted (not a number, or outside the range of the unit).'),
} as const satisfies Record<string, WordEntry>;

/** Warnings of a file read (src/lib/ingest/reader.ts, IngestWarningCode). */
export const INGEST_WARNING_WORDS = {
  RAGGED_ROWS: code('rows of uneven length', 'Some rows have more or fewer fields than the header.'),
  UNREADABLE_TIMES: code('times that cannot be read', 'Some rows have a time that cannot be read; they were skipped.'),
  DUPLICATE_TIMES: code('repeated times', 'Some rows repeat the time of the row before; the later value counts.'),
  BACKWARDS_TIMES: code('times going backwards', 'Some rows are earlier than the row before; they were dropped.'),
  DST_REPEATED_HOUR: code('clock-change hour repeated', 'Times in the hour the clocks go back are ambiguous; the export was read in order.'),
  DST_GAP: code('times in the skipped hour', 'Some times fall into the hour the clocks skip in spring.'),
  UNKNOWN_QUALITY: code('unknown quality words', 'Some quality cells are not known words or codes; their values were used as uncertain.'),
  MALFORMED_QUOTES: code('text after a closing quote', 'Some quoted fields have text after the closing quote; it was kept.'),
  BLANK_TAG_NAMES: code('rows without a tag name', 'Some rows have no tag name and were skipped.'),
  TIMES_OUTSIDE_WINDOW: code('times outside the window', 'Some times lie outside the window of times Lossline accepts.'),
  IMPOSSIBLE_VALUES: code('impossible values', 'Some values cannot be physical for their unit and were rejected.'),
  COLUMNS_WITHOUT_NUMBERS: code('columns without numbers', 'Some columns hold no numbers and were not read as tags.'),
  BAD_TAG_NAMES: code('unusable tag names', 'Some rows have a tag name that is too long or made of control characters.'),
} as const satisfies Record<string, WordEntry>;

/** Errors of the HTTP API (src/server/errors.ts, ERROR_CODES), as a page says them. */
export const APP_ERROR_WORDS = {
  VALIDATION_FAILED: code('input not accepted', 'Part of what was sent is not valid; the message says which field.'),
  UNAUTHENTICATED: code('not signed in', 'Sign in to go on.'),
  FORBIDDEN: code('not allowed', 'Your role or your sites do not allow this.'),
  NOT_FOUND: code('not found', 'The item does not exist or was removed.'),
  METHOD_NOT_ALLOWED: code('not possible here', 'This address does not take this kind of request.'),
  CONFLICT: code('changed meanwhile', 'Someone changed it in the meantime, or it clashes with what is there; reload and try again.'),
  PAYLOAD_TOO_LARGE: code('too large', 'What was sent is larger than Lossline accepts.'),
  RATE_LIMITED: code('too many requests', 'This token or person sent more requests in a minute than allowed; wait the seconds the answer names, then go on.'),
  UNPROCESSABLE: code('cannot be worked with', 'The input is valid but cannot be worked with; the message says why.'),
  INTERNAL: code('fault on the server', 'Something went wrong on the server; nothing was half written. Try again or tell an admin.'),
} as const satisfies Record<string, WordEntry>;
