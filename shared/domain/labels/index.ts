export { LabelFormatError } from './errors.ts';
export { canonicalLabelText } from './canonical.ts';
export { DATA_IDENTIFIERS, describeDataIdentifier, isDataIdentifier, splitDataIdentifier } from './data-identifiers.ts';
export {
  DEFAULT_SUBSTITUTES,
  EOT,
  FORMAT_06,
  GS,
  MESSAGE_HEADER,
  RS,
  formatLabel,
  normaliseSeparators,
  parseLabel,
} from './iso-15434.ts';
export type { LabelElement, LabelFields, ParseLabelOptions, ParsedLabel, SeparatorSubstitutes } from './iso-15434.ts';
export {
  CONTAINER_CODE_FORMAT,
  DEFAULT_PURCHASE_ORDER_PATTERN,
  MAX_OWN_CODE_SEQUENCE,
  classifyPlainCode,
  makeContainerCode,
  makeLotCode,
  ownCodeSortKey,
  parseOwnCode,
} from './own-codes.ts';
export type { ClassifyOptions, OwnCode, OwnCodeKind, OwnCodeOptions, PlainCodeKind } from './own-codes.ts';
export { dataMatrixCodewords, encodeDataMatrix } from './data-matrix.ts';
export type { DataMatrixSymbol } from './data-matrix.ts';
