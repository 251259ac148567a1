/**
 * EDF [Kemp et al. 1992], EDF+ continuous/discontinuous [Kemp & Olivan 2003] and BDF/BDF+ (24-bit, BioSemi)
 * reader over a ByteSource. Byte layout: docs/methods.md §11. The file is read in slices: the header, then
 * batches of whole data records (about 8 MB at a time), so a 500 MB recording is never one buffer.
 *
 * Conventions of the results:
 * - Voltage channels (uV, µV with U+00B5 or U+03BC, mV, V) come out in 'uV' with physical values, ranges
 *   included, scaled to microvolts; the header's own text stays in `headerUnit`.
 * - Times are seconds from the first stored sample (BIDS). EDF+ writes the first record's time-keeping TAL as
 *   `+0` or `+0.X` (the sub-second part of the start time); that first onset is subtracted from every record
 *   onset and annotation onset, and the reported start is the header's start plus it, with the fraction
 *   ("2026-03-02T09:15:30.214") [Kemp & Olivan 2003 §2.2.4].
 * - EDF+D/BDF+D: record onsets come from the time-keeping TALs; each gap before a record becomes an event
 *   with source 'boundary', label 'boundary' and the gap length as its duration.
 * - Records = −1 (still recording) is replaced by the count of whole records in the file, with a warning.
 */
export {
  EDF_MAIN_HEADER_BYTES,
  parseEdfHeader,
  readEdfLayout,
  voltageScaleToMicrovolts,
  type EdfErrorCode,
  type EdfLayout,
  type EdfSignalLayout,
  type ParsedHeader,
} from './edf-header.ts';
export { readEdfInfo } from './edf-annotations.ts';
export { iterateEdfSignals, readEdfSignals, type EdfReadOptions, type EdfSignalChunk } from './edf-samples.ts';
