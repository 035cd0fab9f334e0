/**
 * The one way Sternpost writes a date, a number with its unit and a verdict, on every screen and
 * in the PDF. Plain module: the server, the browser and the PDF renderer share it.
 */
export {
  DEFAULT_TIME_ZONE,
  dateStyles,
  formatMoment,
  formatStamp,
  isTimeZone,
  zoneAbbreviation,
} from "./dates";
export type { DateStyle } from "./dates";
export {
  formatCount,
  formatEntered,
  formatFigure,
  formatNumber,
  formatQuantity,
  unitSymbol,
} from "./quantities";
export { calcVerdictWords, verdictInWords, verdictOnRecord, verdictWords } from "./verdicts";
export type { RecordShape, RecordVerdict } from "./verdicts";
