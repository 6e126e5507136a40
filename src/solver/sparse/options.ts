/** Options of the sparse LU (complex and real alike). */

/**
 * 'none': the values as given. 'rows-cols': rows and columns are equilibrated first (see scaling.ts), so that
 * pivot choice and the singular test see a matrix whose rows and columns have largest entries near 1.
 */
export type LuScaling = 'none' | 'rows-cols';

export interface LuOptions {
  /** Diagonal preference: keep the diagonal if |diag| >= pivotTol * max |candidate|. Default 1e-3. */
  pivotTol?: number;
  /**
   * refactor() keeps a reused pivot while |pivot| >= refactorTol * max |candidate| in its column. Default 1e-4:
   * below pivotTol on purpose, so that a diagonal accepted near the threshold by factor() does not send
   * every slightly different frequency back to a full factorisation.
   */
  refactorTol?: number;
  /**
   * A column is singular if max |candidate| <= singularTol * (largest |a_ij| in A(:,j) or |u_ij| in U(:,k)),
   * in the scaled matrix when `scale` is on. Default 1e-14.
   */
  singularTol?: number;
  /**
   * When the factors show growth (see solve), solve() refines x while its normwise backward error is above
   * this, at most two steps. Default 1e-14; Infinity never refines.
   */
  refineTol?: number;
  /**
   * Row and column equilibration before pivoting, by powers of two (no rounding added). factor() computes the
   * scale factors; refactor() keeps those of the last factor(), as it keeps its pivots. factor, refactor, solve
   * and solveTransposed take and return unscaled quantities. Default 'none'.
   */
  scale?: LuScaling;
}

export interface ResolvedLuOptions {
  pivotTol: number;
  refactorTol: number;
  singularTol: number;
  refineTol: number;
  scale: LuScaling;
}

export function resolveOptions(options: LuOptions): ResolvedLuOptions {
  const pivotTol = options.pivotTol ?? 1e-3;
  const scale = options.scale ?? 'none';
  if (scale !== 'none' && scale !== 'rows-cols') throw new RangeError(`LuOptions.scale must be 'none' or 'rows-cols', not ${String(scale)}`);
  return {
    pivotTol,
    refactorTol: options.refactorTol ?? Math.min(1e-4, pivotTol),
    singularTol: options.singularTol ?? 1e-14,
    refineTol: options.refineTol ?? 1e-14,
    scale,
  };
}
