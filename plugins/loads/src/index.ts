/**
 * @skein/plugin-loads: the standard linear loads. The default export is the ordered list
 * [resistor, capacitor, inductor, series-rlc, parallel-rlc, short, open, timed-switch].
 */
import { capacitorLoad } from './capacitor.ts';
import { inductorLoad } from './inductor.ts';
import { openLoad } from './open.ts';
import { parallelRlcLoad } from './parallelRlc.ts';
import { resistorLoad } from './resistor.ts';
import { seriesRlcLoad } from './seriesRlc.ts';
import { shortLoad } from './short.ts';
import { timedSwitchLoad } from './timedSwitch.ts';

export { capacitorLoad } from './capacitor.ts';
export { inductorLoad } from './inductor.ts';
export { openLoad } from './open.ts';
export { parallelRlcLoad } from './parallelRlc.ts';
export { resistorLoad } from './resistor.ts';
export { seriesRlcLoad } from './seriesRlc.ts';
export { shortLoad } from './short.ts';
export { timedSwitchLoad } from './timedSwitch.ts';

/** Every standard load, in registration order. */
const loads = [resistorLoad, capacitorLoad, inductorLoad, seriesRlcLoad, parallelRlcLoad, shortLoad, openLoad, timedSwitchLoad];
export default loads;
