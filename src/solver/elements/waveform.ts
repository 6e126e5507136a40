/**
 * Source waveforms: the schema, the value at a time and the corners are
 * defined once in src/model/waveform.ts (the sheet and the editor's preview use
 * them too); the element definitions and the time domain read them from here.
 */
export { waveformSchema, waveformAt, waveformCorners, WAVEFORM_SHAPES, type Waveform, type WaveformShape } from '../../model/waveform';
