export * from './quantities';
export { parseReading, type Reading, type ReadingError, type ReadingErrorCode, type ParseReadingResult } from './parse';
export { formatReading, formatLimit, formatSignificant, roundToSignificant, type FormatOptions } from './format';
export { E_SERIES, nearestPreferred, type ESeriesName, type PreferredValue } from './e-series';
export { bandContains, bandFor, checkBandCoverage, type BandProblem, type End, type Interval } from './bands';
export * from './verdict';
export * from './formula';
export { checkVin, vinCheckDigit, type VinCheck } from '../vin';
