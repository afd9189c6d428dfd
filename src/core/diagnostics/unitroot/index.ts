/** Unit-root and stationarity tests: ADF, Phillips–Perron, KPSS, and their joint summary. */
export { adf, schwertLag, TSTAT_THRESHOLD } from "./adf";
export type { AdfOptions, AdfResult, LagRule } from "./adf";
export { pp, ppBandwidth, bartlettLongRunVariance } from "./pp";
export type { PpOptions, PpResult } from "./pp";
export { kpss, kpssPValue, KPSS_TABLE } from "./kpss";
export type { KpssCase, KpssOptions, KpssResult } from "./kpss";
export { mackinnonP, mackinnonCritical, caseLabel, tabulatedLevel, unitRootVerdict } from "./mackinnon";
export type { UnitRootCase } from "./mackinnon";
export { unitRootSummary } from "./integration";
export type { Evidence, JudgedScale, TransformResults, UnitRootSummary, UnitRootSummaryOptions } from "./integration";
