// Count series: readings pasted or uploaded as text, in a column layout of Sealwright's own.
//
// Long layout (one reading per line):      Wide layout (one line per instant):
//   t,channel,conc                           t,ambient,mask
//   0,ambient,8123.4                         0,8123.4,
//   1,ambient,8090.2                         1,8090.2,
//   14,mask,12.7                             14,,12.7
//
//   t        seconds from the start of the test (a number), or an ISO-8601 timestamp
//            (2025-03-04T09:15:02Z; t = 0 is the first timestamp unless `startTime` is given)
//   channel  ambient | mask  (also a, amb, m, in-mask, inmask; any letter case)
//   conc     concentration in particles/cm³
//   ambient, mask   in the wide layout: the concentration on each channel; either may be blank
//
// Comma, tab or semicolon separated (detected from the first lines; papaparse then reads the
// text, quotes included). Numbers are read with the organization's decimal mark (`decimalMark`,
// point by default): with a point, a comma only groups thousands ("12,500"); with a comma, the
// mirror image, and a comma-separated file must quote its decimals or use tabs or semicolons.
// The header line is optional; column names may carry a unit in brackets ("conc (1/cm³)").
// Without a header the columns are t,channel,conc when the second cell is a word, otherwise
// t,ambient,mask. Rows and columns in issues are 1-based, as the user sees them.
//
// Three layers, one file each: count-series-cells.ts (numbers, names, delimiter, columns),
// count-series-rows.ts (readCountSeries) and count-series-segments.ts (segmentation by the
// protocol's timeline). This file is their public face.

export type { Channel, SeriesLayout } from './count-series-cells'
export { detectDelimiter } from './count-series-cells'
export type { CountReading, ReadSeriesOptions, ReadSeriesResult } from './count-series-rows'
export { readCountSeries } from './count-series-rows'
export type { CountSeriesResult, ExerciseSegment, PhaseMean, SegmentOptions, SegmentResult } from './count-series-segments'
export { parseCountSeries, segmentCountSeries, segmentsToFitTestInputs } from './count-series-segments'
