import { Initial1764640000000 } from './1764640000000-initial';
import { ScreensSeries1796176187568 } from './1796176187568-screens-series';
import { Reports1796300000000 } from './1796300000000-reports';

/** Every migration, in order (listed explicitly; see STACK.md). */
export const migrations = [Initial1764640000000, ScreensSeries1796176187568, Reports1796300000000];
