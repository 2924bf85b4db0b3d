/**
 * @skein/plugin-devices: the standard nonlinear and switching devices. The default export is the
 * ordered list [diode, tvs-clamp, varistor, spark-gap, controlled-switch, ramped-switch, filament].
 */
import { controlledSwitchLoad } from './controlledSwitch.ts';
import { diodeLoad } from './diode.ts';
import { filamentLoad } from './filament.ts';
import { rampedSwitchLoad } from './rampedSwitch.ts';
import { sparkGapLoad } from './sparkGap.ts';
import { tvsClampLoad } from './tvs.ts';
import { varistorLoad } from './varistor.ts';

export { diodeLoad, DiodeDevice, thermalVoltage, K_OVER_Q, type ShockleyParams } from './diode.ts';
export { tvsClampLoad, TvsDevice } from './tvs.ts';
export { varistorLoad, VaristorDevice, monotoneSlopes } from './varistor.ts';
export { sparkGapLoad, SparkGapDevice } from './sparkGap.ts';
export { controlledSwitchLoad, ControlledSwitchDevice } from './controlledSwitch.ts';
export { rampedSwitchLoad, RampedSwitchDevice } from './rampedSwitch.ts';
export { filamentLoad, FilamentDevice } from './filament.ts';
export { JunctionDevice, expLinear, expArgMax, limitExponentialStep, EXP_ARG_MAX, EXP_LINEAR_CURRENT_A } from './junction.ts';
export { DeviceMeter, finishDevice, RATING_PARAMS, type Ratings } from './meter.ts';

/** Every standard device, in registration order. */
const devices = [diodeLoad, tvsClampLoad, varistorLoad, sparkGapLoad, controlledSwitchLoad, rampedSwitchLoad, filamentLoad];
export default devices;
