/**
 * The discrete operator of one grid level, as flat stencil arrays on a padded layout.
 *
 * Layout: every vector on a level has a one-node halo all round, so node (i, j) of an nx × ny grid
 * sits at index `(j + 1)·stride + i + 1` with `stride = nx + 3`, and the length is
 * `(nx + 3)(ny + 3)`. Halo entries are zero and stay zero; stencil coefficients that point into
 * the halo are zero. This lets every kernel run one uniform loop over all nodes, boundary included.
 * Use {@link LevelOperator.pad} / {@link LevelOperator.unpad} to convert from and to the public
 * layout of {@link Problem} (x fastest, no halo).
 *
 * Row k of the system is `W·u[k−1] + E·u[k+1] + S·u[k−stride] + N·u[k+stride] + C·u[k] = rhs[k]`
 * on a five-point level. A nine-point level (a mixed term u_xy, a full conductivity tensor, or a
 * Galerkin coarse operator) also has the four corner arrays, and its row adds
 * `SW·u[k−stride−1] + SE·u[k−stride+1] + NW·u[k+stride−1] + NE·u[k+stride+1]`. Five-point levels
 * have no corner arrays at all, so their kernels stay the five-point loops (see
 * {@link isNinePoint}).
 *
 * @module
 */

/** One level's operator (see the module doc for the layout). */
export interface LevelOperator {
  /** Intervals along x. */
  readonly nx: number;
  /** Intervals along y. */
  readonly ny: number;
  /** Mesh width along x. */
  readonly hx: number;
  /** Mesh width along y. */
  readonly hy: number;
  /** Row stride of the padded layout: nx + 3. */
  readonly stride: number;
  /** Length of every padded vector of this level: (nx + 3)(ny + 3). */
  readonly length: number;
  /**
   * Stencil coefficients per node (padded layout; zero in the halo). When the operator has no
   * first-order terms and only Dirichlet-like sides, `E === W` and `N === S` (the same arrays).
   */
  readonly W: Float64Array;
  /** Coefficient of the east neighbour u[k + 1]. */
  readonly E: Float64Array;
  /** Coefficient of the south neighbour u[k − stride]. */
  readonly S: Float64Array;
  /** Coefficient of the north neighbour u[k + stride]. */
  readonly N: Float64Array;
  /** Diagonal coefficient (1 on Dirichlet rows). */
  readonly C: Float64Array;
  /** Coefficient of the south-west neighbour u[k − stride − 1]; nine-point levels only. */
  readonly SW?: Float64Array;
  /** Coefficient of the south-east neighbour u[k − stride + 1]; nine-point levels only. */
  readonly SE?: Float64Array;
  /** Coefficient of the north-west neighbour u[k + stride − 1]; nine-point levels only. */
  readonly NW?: Float64Array;
  /** Coefficient of the north-east neighbour u[k + stride + 1]; nine-point levels only. */
  readonly NE?: Float64Array;
  /** 1 / C (1 in the halo, never used there). */
  readonly invC: Float64Array;
  /** Padded indices of the Dirichlet rows (identity rows u = value). */
  readonly dirichlet: Int32Array;
  /** Whether constants are in the null space (only Neumann-like sides and e ≡ 0). */
  readonly singular: boolean;
  /** Padded index of node (i, j). */
  index(i: number, j: number): number;
  /** A new zero vector of this level (padded). */
  vector(): Float64Array;
  /** Copies a public-layout array ((nx+1)(ny+1), x fastest) into a new padded vector. */
  pad(values: Float64Array): Float64Array;
  /** Copies a padded vector out into a new public-layout array. */
  unpad(padded: Float64Array): Float64Array;
}

/** A level with its four corner arrays (a nine-point stencil). */
export type NinePointOperator = LevelOperator & {
  readonly SW: Float64Array;
  readonly SE: Float64Array;
  readonly NW: Float64Array;
  readonly NE: Float64Array;
};

/**
 * Whether a level carries corner couplings (all four corner arrays are present together).
 *
 * @example
 * ```ts
 * import { isNinePoint, levelLayout } from "./level.ts";
 * const l = levelLayout(2, 2);
 * const five = { ...l } as never, nine = { ...l, NE: l.vector() } as never;
 * if (isNinePoint(five) || !isNinePoint(nine)) throw new Error("corners");
 * ```
 */
export function isNinePoint(op: LevelOperator): op is NinePointOperator {
  return op.NE !== undefined;
}

/**
 * Builds the layout helpers of a level; the caller supplies the coefficient arrays.
 *
 * @example
 * ```ts
 * import { levelLayout } from "./level.ts";
 * const l = levelLayout(2, 3);
 * if (l.index(0, 0) !== 6 || l.length !== 30) throw new Error("layout");
 * ```
 */
export function levelLayout(nx: number, ny: number): Pick<
  LevelOperator,
  "nx" | "ny" | "stride" | "length" | "index" | "vector" | "pad" | "unpad"
> {
  const stride = nx + 3;
  const length = stride * (ny + 3);
  return {
    nx,
    ny,
    stride,
    length,
    index: (i, j) => (j + 1) * stride + i + 1,
    vector: () => new Float64Array(length),
    pad(values) {
      if (values.length !== (nx + 1) * (ny + 1)) {
        throw new RangeError(
          `Cannot pad a vector of length ${values.length}: a ${nx}×${ny} grid has ${
            (nx + 1) * (ny + 1)
          } nodes`,
        );
      }
      const out = new Float64Array(length);
      for (let j = 0; j <= ny; j++) {
        out.set(values.subarray(j * (nx + 1), (j + 1) * (nx + 1)), (j + 1) * stride + 1);
      }
      return out;
    },
    unpad(padded) {
      const out = new Float64Array((nx + 1) * (ny + 1));
      for (let j = 0; j <= ny; j++) {
        const base = (j + 1) * stride + 1;
        out.set(padded.subarray(base, base + nx + 1), j * (nx + 1));
      }
      return out;
    },
  };
}

/**
 * Moves the node values of a padded vector to its front, in place, and returns them as a view of
 * (nx + 1)(ny + 1) values in the public layout (x fastest, no halo) on the same buffer: the result
 * of `unpad` without a new array, for a padded vector that is not needed any more (the solution
 * of a finished solve). Each row moves to a lower or equal index, so copying rows in order never
 * overwrites a value not yet moved.
 *
 * @param op Grid counts and stride of the vector's level.
 * @param padded The padded vector; its contents are destroyed.
 * @returns A view on `padded.buffer` holding the node values.
 *
 * @example
 * ```ts
 * import { levelLayout, unpadInPlace } from "./level.ts";
 * const l = levelLayout(2, 1), v = l.pad(Float64Array.of(1, 2, 3, 4, 5, 6));
 * if (unpadInPlace(l, v).join() !== "1,2,3,4,5,6") throw new Error("unpad");
 * ```
 */
export function unpadInPlace(
  op: Pick<LevelOperator, "nx" | "ny" | "stride">,
  padded: Float64Array,
): Float64Array {
  const { nx, ny, stride } = op;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    padded.copyWithin(j * (nx + 1), base, base + nx + 1);
  }
  return padded.subarray(0, (nx + 1) * (ny + 1));
}
