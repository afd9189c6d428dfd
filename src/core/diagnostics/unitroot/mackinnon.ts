/**
 * Distribution of the Dickey–Fuller τ statistic for one variable (N = 1), from MacKinnon's
 * response surfaces:
 *  - p-values: MacKinnon (1994), "Approximate asymptotic distribution functions for unit-root
 *    and cointegration tests", JBES 12(2), where Φ⁻¹(p) is a polynomial in τ — quadratic for
 *    the lower tail (τ ≤ τ*) and cubic above it — and p is 0 below τ_min and 1 above τ_max;
 *  - critical values: MacKinnon (2010), "Critical values for cointegration tests", Queen's
 *    Economics Department WP 1227, Table 2: C(p) = β∞ + β1/T + β2/T² + β3/T³.
 *
 * The coefficients were typed from memory of the published tables (N = 1 rows only); the tests
 * check them against the printed asymptotic critical values and against an outside reference
 * (test/reference/make_unitroot.py), which is how a typing slip would show.
 *
 * Cases: "n" no deterministic terms, "c" a constant, "ct" a constant and a linear trend.
 */
import { normalCdf } from "../../math/distributions";

export type UnitRootCase = "n" | "c" | "ct";

interface PValueSurface {
  /** Below this τ the p-value is 0 to the surface's accuracy. */
  tauMin: number;
  /** Switch point between the small-p (quadratic) and large-p (cubic) polynomials. */
  tauStar: number;
  /** Above this τ the p-value is 1. */
  tauMax: number;
  /** γ0, γ1, γ2 of Φ⁻¹(p) = γ0 + γ1τ + γ2τ² for τ ≤ τ*. */
  smallP: readonly [number, number, number];
  /** γ0…γ3 of Φ⁻¹(p) = γ0 + γ1τ + γ2τ² + γ3τ³ for τ > τ*. */
  largeP: readonly [number, number, number, number];
}

// MacKinnon (1994), N = 1 rows of the τ tables (the printed large-p γ1, γ2, γ3 are scaled by
// 10, 10 and 100; here they are written unscaled; the small-p γ2 is printed ×100).
const SURFACES: Record<UnitRootCase, PValueSurface> = {
  n: {
    tauMin: -19.04,
    tauStar: -1.04,
    // No upper cut-off for this case: its large-p cubic is increasing everywhere (the
    // derivative's discriminant is negative), so it cannot turn back down as the others do.
    // I first typed 1.51 here (the N = 2 entry); the outside reference showed the slip.
    tauMax: Infinity,
    smallP: [0.6344, 1.2378, 0.032496],
    largeP: [0.4797, 0.93557, -0.06999, 0.033066],
  },
  c: {
    tauMin: -18.83,
    tauStar: -1.61,
    tauMax: 2.74,
    smallP: [2.1659, 1.4412, 0.038269],
    largeP: [1.7339, 0.93202, -0.12745, -0.010368],
  },
  ct: {
    tauMin: -16.18,
    tauStar: -2.89,
    tauMax: 0.7,
    smallP: [3.2512, 1.6047, 0.049588],
    largeP: [2.5261, 0.61654, -0.37956, -0.060285],
  },
};

/**
 * Asymptotic p-value of a Dickey–Fuller τ (lower-tail test): P(τ∞ ≤ tau) under a unit root.
 * MacKinnon (1994), eq. for the response surface Φ⁻¹(p) = Σ γ_k τ^k.
 */
export function mackinnonP(tau: number, regression: UnitRootCase): number {
  if (!Number.isFinite(tau)) {
    if (Number.isNaN(tau)) return NaN;
    return tau > 0 ? 1 : 0;
  }
  const s = SURFACES[regression];
  if (tau > s.tauMax) return 1;
  if (tau < s.tauMin) return 0;
  if (tau <= s.tauStar) {
    const g = s.smallP;
    return normalCdf(g[0] + tau * (g[1] + tau * g[2]));
  }
  const g = s.largeP;
  return normalCdf(g[0] + tau * (g[1] + tau * (g[2] + tau * g[3])));
}

/** β∞, β1, β2, β3 at the 1%, 5% and 10% levels. */
type CritRow = readonly [number, number, number, number];

// MacKinnon (2010), Table 2, N = 1 ("nc", "c", "ct" rows). A blank β3 in the table is 0.
const CRIT: Record<UnitRootCase, { "1%": CritRow; "5%": CritRow; "10%": CritRow }> = {
  n: {
    "1%": [-2.56574, -2.2358, -3.627, 0],
    "5%": [-1.941, -0.2686, -3.365, 31.223],
    "10%": [-1.61682, 0.2656, -2.714, 25.364],
  },
  c: {
    "1%": [-3.43035, -6.5393, -16.786, -79.433],
    "5%": [-2.86154, -2.8903, -4.234, -40.04],
    "10%": [-2.56677, -1.5384, -2.809, 0],
  },
  ct: {
    "1%": [-3.95877, -9.0531, -28.428, -134.155],
    "5%": [-3.41049, -4.3904, -9.036, -45.374],
    "10%": [-3.12705, -2.5856, -3.925, -22.38],
  },
};

/**
 * Finite-sample critical values of τ at 1%, 5% and 10% for a regression on `nobs`
 * observations (Infinity gives the asymptotic values β∞). MacKinnon (2010), eq. (2).
 */
export function mackinnonCritical(regression: UnitRootCase, nobs: number = Infinity): Record<"1%" | "5%" | "10%", number> {
  if (!(nobs > 0)) throw new RangeError(`mackinnonCritical: nobs must be positive, got ${nobs}`);
  const rows = CRIT[regression];
  const inv = Number.isFinite(nobs) ? 1 / nobs : 0;
  const at = (b: CritRow): number => b[0] + inv * (b[1] + inv * (b[2] + inv * b[3]));
  return { "1%": at(rows["1%"]), "5%": at(rows["5%"]), "10%": at(rows["10%"]) };
}

const TABLE_LEVELS: readonly { key: "1%" | "5%" | "10%"; level: number }[] = [
  { key: "1%", level: 0.01 },
  { key: "5%", level: 0.05 },
  { key: "10%", level: 0.1 },
];

/**
 * The MacKinnon (2010) table key ("1%", "5%", "10%") for a verdict level, or null when the
 * level is not one the response surfaces tabulate.
 */
export function tabulatedLevel(level: number): "1%" | "5%" | "10%" | null {
  for (const l of TABLE_LEVELS) if (Math.abs(level - l.level) < 1e-12) return l.key;
  return null;
}

/**
 * Verdict of a lower-tail Dickey–Fuller-type test. At a tabulated level (1%, 5%, 10%) the
 * statistic is compared with the finite-sample critical value — the one the report prints —
 * because the MacKinnon (1994) p-value is asymptotic and, in short series, sits below the
 * level for statistics the finite-sample value does not reject (MacKinnon 2010, Table 2
 * moves the 5% "ct" value from −3.41 at T = ∞ to −3.67 at T = 19). Other levels have no
 * finite-sample value, so the asymptotic p-value decides.
 */
export function unitRootVerdict(
  statistic: number,
  pValue: number,
  critical: Record<"1%" | "5%" | "10%", number>,
  level: number,
): { rejected: boolean; decidedBy: string } {
  const key = tabulatedLevel(level);
  if (key !== null) return { rejected: statistic < critical[key], decidedBy: `${key} critical value at this length` };
  return { rejected: pValue < level, decidedBy: "asymptotic p-value" };
}

/** Words for a case, used in test names: "no constant", "constant", "constant + trend". */
export function caseLabel(regression: UnitRootCase): string {
  return regression === "n" ? "no constant" : regression === "c" ? "constant" : "constant + trend";
}
