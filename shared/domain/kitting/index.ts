export { KittingInputError } from './errors.ts';
export { makeKitCode, parseKitCode } from './kit-code.ts';
export { KIT_LABEL_MAX_CODEWORDS, kitLabelPayload, kitPartReferences, parseKitPartReferences } from './kit-label.ts';
export type { KitLabelInput, KitLabelPart, KitLabelPayload } from './kit-label.ts';
export { checkPull, comparePick, nextToPull, orderPickList, pullProgress, readPickScan } from './pick-list.ts';
export type { PickPart, PickScan, PullCheck } from './pick-list.ts';
export { DEFAULT_HOLD_MINUTES, MAX_HOLD_MINUTES, MIN_HOLD_MINUTES, reservationEnd, reservationExpired } from './reservation.ts';
