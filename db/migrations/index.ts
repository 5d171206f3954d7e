import { Initial1764640000000 } from './1764640000000-initial';
import { ScreensSeries1796176187568 } from './1796176187568-screens-series';
import { Traces1796200000000 } from './1796200000000-traces';
import { Reports1796300000000 } from './1796300000000-reports';
import { PendingRegistrations1796400000000 } from './1796400000000-pending-registrations';
import { ScreenResultsWithoutRowTrigger1796500000000 } from './1796500000000-screen-results-without-row-trigger';
import { WorkspaceDeletions1796600000000 } from './1796600000000-workspace-deletions';
import { Sessions1796700000000 } from './1796700000000-sessions';
import { ReportTransitionSnapshots1796760000000 } from './1796760000000-report-transition-snapshots';
import { ScreenScoreHbarOmega1796770000000 } from './1796770000000-screen-score-hbar-omega';
import { Cascades1796800000000 } from './1796800000000-cascades';
import { CascadeReports1796810000000 } from './1796810000000-cascade-reports';
import { CascadeDesign1796815000000 } from './1796815000000-cascade-design';
import { ElectrodeCases1796820000000 } from './1796820000000-electrode-cases';
import { Materials1796830000000 } from './1796830000000-materials';

/** Every migration, in order (listed explicitly; see STACK.md). */
export const migrations = [
  Initial1764640000000,
  ScreensSeries1796176187568,
  Traces1796200000000,
  Reports1796300000000,
  PendingRegistrations1796400000000,
  ScreenResultsWithoutRowTrigger1796500000000,
  WorkspaceDeletions1796600000000,
  Sessions1796700000000,
  ReportTransitionSnapshots1796760000000,
  ScreenScoreHbarOmega1796770000000,
  Cascades1796800000000,
  CascadeReports1796810000000,
  CascadeDesign1796815000000,
  ElectrodeCases1796820000000,
  Materials1796830000000,
];
