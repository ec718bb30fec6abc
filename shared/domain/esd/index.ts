export { EsdInputError } from './errors.ts';
export { ESD_CAUTION_TEXT, ESD_HBM_CLASSES, describeEsdClass, esdClassForVoltage } from './hbm-classes.ts';
export type { EsdHbmClass, EsdHbmClassId } from './hbm-classes.ts';
