/** Options of the sparse LU (complex and real alike). */

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
   * A column is singular if max |candidate| <= singularTol * (largest |a_ij| in A(:,j) or |u_ij| in U(:,k)).
   * Default 1e-14.
   */
  singularTol?: number;
  /**
   * When the factors show growth (see solve), solve() refines x while its normwise backward error is above
   * this, at most two steps. Default 1e-14; Infinity never refines.
   */
  refineTol?: number;
}

export interface ResolvedLuOptions {
  pivotTol: number;
  refactorTol: number;
  singularTol: number;
  refineTol: number;
}

export function resolveOptions(options: LuOptions): ResolvedLuOptions {
  const pivotTol = options.pivotTol ?? 1e-3;
  return {
    pivotTol,
    refactorTol: options.refactorTol ?? Math.min(1e-4, pivotTol),
    singularTol: options.singularTol ?? 1e-14,
    refineTol: options.refineTol ?? 1e-14,
  };
}
