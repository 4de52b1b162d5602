/**
 * Words for the states and kinds Lossline stores as short codes: hour states, upload states, notice
 * states, unit kinds, port slots and directions, fluids, what a link measures, balance roles.
 * Where src/lib already holds a label (the unit-kind catalogue, fluids, link quantities), the entry
 * is built from it, so one word is kept in one place.
 */
import type { HourState } from '../hour-states';
import type { CloseOutcome, NoticeKind, NoticeLife, NoticeStatus, NoticeTrend, PriorReason } from '../notice-view';
import { FLUID_KINDS, FLUID_LABELS, UNIT_KINDS, UNIT_KIND_LABELS, type FluidKind, type UnitKind } from '../kinds';
import { LINK_QUANTITIES, LINK_QUANTITY_NAMES, kindSpec, type LinkQuantity } from '../plant/kinds';
import { quantityList, type Quantity } from '../units/quantities';
import { code, type WordEntry } from './types';

export const HOUR_STATE_WORDS: Record<HourState, WordEntry> = {
  steady: code('steady', 'Every key tag is sound and steady, the load is above the minimum and the balances close.'),
  unsettled: code('unsettled', 'The unit ran, but a key tag moved more within the hour than the spread limit allows.'),
  idle: code('idle', 'The unit ran below its minimum load or was declared idle.'),
  suspect: code('suspect', 'A key tag is missing, frozen or out of range, or a balance does not close.'),
};

/** Upload states (src/server/db/ingest-schema.ts, UPLOAD_STATUSES). */
export const UPLOAD_STATE_WORDS = {
  'awaiting-file': code('arriving', 'The upload was announced and its file is on its way.'),
  queued: code('waiting to be read', 'The file is stored and waits for a worker to read it.'),
  'needs-review': code('needs your review', 'Lossline is not sure how the file is laid out; confirm or correct the layout.'),
  processing: code('being read', 'A worker is reading the file.'),
  done: code('read', 'The file was read and its hours are stored.'),
  'read-with-problems': code('read with problems', 'The file was read and its hours are stored, but some rows or cells were rejected.'),
  failed: code('not read', 'The file could not be read; nothing of it was stored. The report says why.'),
} as const satisfies Record<string, WordEntry>;

export const NOTICE_STATUS_WORDS: Record<NoticeStatus, WordEntry> = {
  open: code('open', 'Nobody has looked at the notice yet.'),
  acknowledged: code('seen', 'Someone has seen the notice and is looking into it.'),
  closed: code('closed', 'The notice was closed with an outcome.'),
};
export const NOTICE_KIND_WORDS: Record<NoticeKind, WordEntry> = {
  drift: code('drift', 'Destruction or efficiency moved away from the baseline.'),
  idle: code('idle too long', 'The unit stayed idle longer than its declaration allows.'),
  limit: code('limit crossed', 'A figure of the unit crossed a limit set for it.'),
};
export const NOTICE_LIFE_WORDS: Record<NoticeLife, WordEntry> = {
  live: code('shift present', 'The shift is still in the latest hours.'),
  faded: code('faded', 'The latest hours are back near the baseline.'),
  superseded: code('superseded by a larger shift', 'A later, larger shift has its own notice.'),
  closed: code('closed', 'The notice was closed.'),
};
export const NOTICE_TREND_WORDS: Record<NoticeTrend, WordEntry> = {
  growing: code('growing', 'The shift gets larger.'),
  steady: code('steady', 'The shift stays about the same.'),
  receding: code('receding', 'The shift gets smaller.'),
};
export const CLOSE_OUTCOME_WORDS: Record<CloseOutcome, WordEntry> = {
  repaired: code('repaired', 'The cause was found and repaired.'),
  'instrument-fault': code('instrument fault', 'A measurement was wrong, not the unit.'),
  'new-normal': code('accepted as the new normal', 'The shift is accepted; a new baseline should follow.'),
  'no-action': code('no action', 'Nothing is done about it.'),
};
export const PRIOR_REASON_WORDS: Record<PriorReason, WordEntry> = {
  larger: code('larger shift', 'A later, clearly larger shift than the earlier notice’s.'),
  'after-fade': code('new shift after fading', 'A new shift after the earlier notice had faded.'),
  'after-close': code('new shift after closing', 'A new shift after the earlier notice was closed.'),
  'after-repair': code('still there after repair', 'The shift is still there after the repair recorded on the earlier notice.'),
};

/** Roles of a term in a balance. */
export const BALANCE_ROLE_WORDS = {
  fuel: code('fuel F', 'Exergy the unit uses up.'),
  product: code('product P', 'Exergy the unit delivers.'),
  loss: code('loss L', 'Exergy leaving unused.'),
} as const satisfies Record<string, WordEntry>;

/** Directions of ports (src/lib/plant/kind-spec.ts, PortRole). */
export const PORT_DIRECTION_WORDS = {
  in: code('in', 'Stream or heat into the unit.'),
  out: code('out', 'Stream or heat out of the unit.'),
} as const satisfies Record<string, WordEntry>;

const lower = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);

/** Unit kinds of the plant model, keyed by the one list of src/lib/kinds.ts. */
export const UNIT_KIND_WORDS = Object.fromEntries(
  UNIT_KINDS.map((k) => [k, code(lower(UNIT_KIND_LABELS[k]), `A unit of the kind “${lower(UNIT_KIND_LABELS[k])}”.`)]),
) as Record<UnitKind, WordEntry>;

/** Port slots of every kind (their ids are camelCase: 'hotIn', 'flueGas'), from the kind catalogue. */
export const SLOT_WORDS: Record<string, WordEntry> = Object.fromEntries(
  UNIT_KINDS.flatMap((k) => kindSpec(k).ports.map((s) => [s.slot, code(lower(s.label), `A port of the kind “${lower(s.label)}”.`)] as const)),
);

export const FLUID_WORDS = Object.fromEntries(FLUID_KINDS.map((f) => [f, code(FLUID_LABELS[f], `The port carries ${FLUID_LABELS[f]}.`)])) as Record<FluidKind, WordEntry>;

export const LINK_QUANTITY_WORDS = Object.fromEntries(
  LINK_QUANTITY_NAMES.map((q) => [q, code(LINK_QUANTITIES[q].label, `The tag measures ${LINK_QUANTITIES[q].label}.`)]),
) as Record<LinkQuantity, WordEntry>;

export const QUANTITY_WORDS = Object.fromEntries(quantityList.map((q) => [q.quantity, code(q.label, `A ${q.label}.`)])) as Record<Quantity, WordEntry>;
