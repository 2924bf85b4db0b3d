/**
 * @skein/plugin-surge-waveforms: the standard surge, lightning and ESD source waveforms. The default
 * export is the ordered list [combination-wave, lightning-current, esd-contact].
 */
import { combinationWaveSource } from './combinationWave.ts';
import { esdContactSource } from './esd.ts';
import { lightningCurrentSource } from './lightning.ts';

export {
  combinationWaveSource, COMBINATION_WAVE_SOURCE_RESISTANCE_OHM, COMBINATION_VOLTAGE_TAU1_S, COMBINATION_VOLTAGE_TAU2_S, COMBINATION_CURRENT_TAU_S,
} from './combinationWave.ts';
export { lightningCurrentSource, LIGHTNING_STROKES, LIGHTNING_LEVEL_SCALE, type HeidlerStroke } from './lightning.ts';
export { esdContactSource, ESD_CONTACT_LEVEL_V, ESD_4KV_HEIDLER } from './esd.ts';
export { heidler, heidlerPeakFactor } from './heidler.ts';
export { measureImpulse, integrateCurrent, type ImpulseParameters } from './measure.ts';

/** Every surge waveform, in registration order. */
const surgeWaveforms = [combinationWaveSource, lightningCurrentSource, esdContactSource];
export default surgeWaveforms;
