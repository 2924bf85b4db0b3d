/**
 * @skein/plugin-waveforms: the standard source waveforms. The default export is the ordered list
 * [step, ramp, trapezoid, gaussian, sine, double-exponential, table].
 */
import { doubleExponentialSource } from './doubleExponential.ts';
import { gaussianSource } from './gaussian.ts';
import { rampSource } from './ramp.ts';
import { sineSource } from './sine.ts';
import { stepSource } from './step.ts';
import { tableSource } from './table.ts';
import { trapezoidSource } from './trapezoid.ts';

export { doubleExponentialSource, doubleExponentialPeakTime } from './doubleExponential.ts';
export { gaussianSource } from './gaussian.ts';
export { rampSource } from './ramp.ts';
export { sineSource } from './sine.ts';
export { stepSource } from './step.ts';
export { tableSource } from './table.ts';
export { trapezoidSource } from './trapezoid.ts';

/** Every standard waveform, in registration order. */
const waveforms = [stepSource, rampSource, trapezoidSource, gaussianSource, sineSource, doubleExponentialSource, tableSource];
export default waveforms;
