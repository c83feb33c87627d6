// Public entry point of the upload library: parsing and validating uploaded tables and well logs.
// Pure TypeScript (papaparse, exceljs, proj4, geojson-validation); runs in the browser and on the
// server. Units and coordinate systems live in lib/geo and plausibility limits in
// lib/foundation; the unit and CRS lists are re-exported here for the upload pages.

export { ImportFormatError } from './types';
export type { Cell, ParsedTable, ImportIssue, Severity } from './types';
export { parseCsv, detectDelimiter, CSV_DELIMITERS } from './csv';
export type { CsvDelimiter, CsvOptions } from './csv';
export { parseXlsx, xlsxCellValue } from './xlsx';
export type { XlsxOptions } from './xlsx';
export { parseGeoJson, GEOJSON_COLUMNS } from './geojson';
export { parseTableFile, formatFromFileName } from './table';
export type { TableFormat } from './table';
export {
	parseNumberCell,
	parseCountCell,
	parseYearCell,
	parseTextCell,
	cellText,
	isBlank
} from './cells';
export { FIELDS, field } from './fields';
export type { FieldKey, FieldDef, FieldKind } from './fields';
export { suggestMapping, checkMapping, unmappedColumns, headerWords } from './mapping';
export type { ColumnMapping, ColumnChoice } from './mapping';
export {
	UNITS,
	STORED_UNIT,
	findUnit,
	recogniseUnit,
	normaliseUnit,
	toStoredUnit,
	M_PER_FT,
	KPERKM_PER_DEGF_PER_100FT,
	WMK_PER_MCAL_CM_S_K,
	UWM3_PER_HGU
} from '../geo/units';
export type { Quantity, UnitDef } from '../geo/units';
export { CRS_LIST } from '../geo/crs-list';
export type { CrsEntry } from '../geo/crs-list';
export { getCrs, parseEpsg, searchCrs, toWgs84 } from '../geo/crs';
export type { Wgs84Result } from '../geo/crs';
export { parseAngle } from './dms';
export type { AngleResult } from './dms';
export {
	parseMethod,
	parseCorrections,
	methodSpellings,
	HEAT_FLOW_METHODS,
	CORRECTIONS
} from './vocabulary';
export type { HeatFlowMethod, Correction } from './vocabulary';
export type { SiteDraft } from './site-draft';
export { prepareRowContext, validateRow } from './validate-row';
export type { ValidateOptions, RowResult, RowContext } from './validate-row';
export { buildPreview } from './preview';
export type { ImportPreview } from './preview';
export { issuesToCsv } from './report';
export { parseLas, parseLasLine, lasItem } from './las';
export type { LasFile, LasCurve, LasItem } from './las';
export {
	temperatureLogFromLas,
	temperatureLogFromCsv,
	findTemperatureCurve,
	cleanLog
} from './temperature-log';
export type { TemperatureLog, LasLogOptions, CsvLogOptions } from './temperature-log';
export { parseConductivitySamples } from './conductivity-samples';
export type { ConductivitySamples, ConductivitySampleOptions } from './conductivity-samples';
export { templateCsv, templateColumns, TEMPLATE_FILE_NAME } from './template';
export { applyEdits, NO_EDITS } from './edits';
export type { CellCorrection, RowEdits, AppliedCorrection, EditedTable } from './edits';
export { nearPairs, distanceM, DEFAULT_NEAR_DISTANCE_M } from './near-duplicates';
export type { NearPair } from './near-duplicates';
export { controlCharacter } from './cells';
export { encodeTable, decodeTable } from './table-json';
export type { JsonCell, JsonTable } from './table-json';
export { PREVIEW_COLUMNS, displayValues, roundForDisplay } from './preview-view';
export type { PreviewColumn } from './preview-view';
