/** Analysis methods of the calculation core (fits of measured data against the theory). */
import type { MethodDefinition } from '../core/method';
import { temperatureMethod } from './temperature/temperature';

export {
  fitLine,
  fitTemperatureSeries,
  marcusApparentActivationEv,
  temperatureMethod,
} from './temperature/temperature';
export type { LineFit, TemperatureFit } from './temperature/temperature';

/** Every `analysis.*` method, for the registry. */
export const analysisMethods: MethodDefinition<any>[] = [temperatureMethod];
