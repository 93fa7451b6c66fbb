import 'server-only';
/**
 * The import core: readers (delimited text, XLSX), column auto-mapping, conversion to SI, the
 * trial row schema and the sensor-log builder. Pure modules (no DB, no HTTP); the files without
 * Node APIs (auto-map, column-units, read-date, read-number, trial-row) may also be imported
 * directly by client components, e.g. for the mapping screen.
 */
export { ImportError, describeLocation, type ImportErrorCode, type SourceLocation } from './import-error';
export { decodeText, formatBytes, type DecodeOptions, type DecodedText, type TextEncoding } from './decode-text';
export { detectDelimiter, detectDecimal, detectNewline, findHeaderRow, type Delimiter, type DecimalSeparator, type Newline } from './detect-dialect';
export { openDelimited, readDelimited, type Dialect, type DelimitedSource, type DelimitedTable, type MetadataLine, type ReadDelimitedOptions, type RowBatch } from './read-delimited';
export { checkHeader, columnLetter, cleanHeaderCell } from './check-header';
export { listSheets, readXlsxSheet, dateCellText, type SheetInfo, type XlsxTable, type XlsxOptions, type CellWarning } from './read-xlsx';
export { checkZip, listZipEntries, DEFAULT_ZIP_LIMITS, type ZipLimits, type ZipEntryInfo } from './zip-guard';
export { readNumber, readNumberWithUnit, looksNumeric, type NumberWithUnit } from './read-number';
export { readDate, readSerialDate, detectDateOrder, type DateOrder, type DateReading, type DateOptions } from './read-date';
export {
  TRIAL_FIELDS, FIELD_KIND, UNITS_BY_KIND, UNIT_LABEL, DEFAULT_UNIT, readUnit, toSI, unitFitsField, kindOfUnit,
  type TrialField, type ColumnUnit, type AffineToSI,
} from './column-units';
export { suggestMapping, splitHeader, nameTokens, missingTrialFields, type ColumnSuggestion, type MappingSuggestion, type HeaderParts } from './auto-map';
export { headerSignature, normaliseHeaderName } from './header-signature';
export {
  confirmedMappingSchema, checkMapping, createRowMapper, describeMixedUnits,
  type ConfirmedMapping, type ConfirmedMappingInput, type CellValue, type RowMapper, type MappedTrialRow, type ColumnUnitReport,
} from './apply-mapping';
export {
  trialRowSchema, trialTimeSchema, checkTrialRow, plausibilityWarnings, DEFAULT_PLAUSIBILITY,
  type TrialRow, type TrialTime, type CheckedTrialRow, type RowIssue, type TrialRowResult, type PlausibilityLimits,
} from '../rigs/trial-rule';
export { importTrialSheet, type CellTable, type TrialSheetResult } from './import-trial-sheet';
export { createSensorLogBuilder, sensorSampleSchema, type SensorLog, type SensorLogBuilder, type SensorSample } from './sensor-log';
