/**
 * @skein/plugin-probes: the standard probes. The default export is the ordered list
 * [node-voltage, voltage-between, line-end-current, line-point, part, energy-ledger, space-time].
 */
import { energyLedgerProbe } from './energyLedger.ts';
import { lineEndCurrentProbe } from './lineEndCurrent.ts';
import { linePointProbe } from './linePoint.ts';
import { nodeVoltageProbe } from './nodeVoltage.ts';
import { partProbe } from './part.ts';
import { voltageBetweenProbe } from './voltageBetween.ts';
import { spaceTimeProbe } from './spaceTime.ts';

export { energyLedgerProbe, type LedgerOutput } from './energyLedger.ts';
export { lineEndCurrentProbe } from './lineEndCurrent.ts';
export { linePointProbe } from './linePoint.ts';
export { nodeVoltageProbe } from './nodeVoltage.ts';
export { partProbe } from './part.ts';
export { voltageBetweenProbe } from './voltageBetween.ts';
export { spaceTimeProbe, SPACE_TIME_MAX_VALUES } from './spaceTime.ts';
export { PeakTracker, type TraceExtremes } from './peaks.ts';

/** Every standard probe, in registration order. */
const probes = [nodeVoltageProbe, voltageBetweenProbe, lineEndCurrentProbe, linePointProbe, partProbe, energyLedgerProbe, spaceTimeProbe];
export default probes;
