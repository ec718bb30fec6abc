export { ScreeningInputError } from './errors.ts';
export { hasRoom, nextFreePosition, planPlacement, planPlacements } from './placement.ts';
export { adjustQuantity, statusAfter } from './stock.ts';
export { CONTAINER_KINDS, CONTAINER_STATUSES } from './types.ts';
export type { AdjustResult, ContainerKind, ContainerState, ContainerStatus, NewContainerSpec, Placement } from './types.ts';
export { binIntervalText, binLabelElements, labelSlots } from './bin-label.ts';
export type { BinLabelData, LabelSlot } from './bin-label.ts';
