/**
 * The registry of seeded defects: each is a realistic coding bug, stated as a change to the
 * discretization the zoo assembles or as a rewrite of the finished solve. The closure and sampling
 * choices (`neumann`, `robinBetaSign`, `aShift`, …) act on the non-conservative assembly; the
 * conservative ones (`crossSign`, `faceConductivity`, `neumannData`) on the finite-volume assembly
 * of the conservative form.
 *
 * @module
 */
import type { Side } from "../../reference-solver/mod.ts";
import { gaussSeidel } from "./gauss_seidel.ts";
import type { LinearSystem } from "./system.ts";

/** The choices an assembly makes; the correct scheme is {@link CORRECT_DISCRETIZATION}. */
export interface Discretization {
  /** Sign in front of the b·u_x term. */
  convectionXSign: number;
  /** Difference used for d·u_y: central (u_N − u_S)/(2hy) or forward (u_N − u_C)/hy. */
  convectionY: "central" | "forward";
  /** Spacing whose square divides the u_yy second difference. */
  yySpacing: "hy" | "hx";
  /** Shift, in units of (hx, hy), of the point where coefficient a is sampled. */
  aShift: readonly [number, number];
  /** Shift, in units of (hx, hy), of the point where the source f is sampled, per layout. */
  sourceShift: { vertex: readonly [number, number]; cell: readonly [number, number] };
  /** Vertex layout: shift, in units of (hx, hy), of where a side's Dirichlet data is sampled. */
  dirichletShift: Partial<Record<Side, readonly [number, number]>>;
  /** Cell layout: Dirichlet ghost u_g = 2g − u₁ ("reflect") or u_g = g ("face-value"). */
  cellDirichlet: "reflect" | "face-value";
  /**
   * Neumann closure. "central": vertex ghost node eliminated with the central normal difference,
   * cell ghost u_g = u₁ + h·g. "one-sided": vertex row (u_boundary − u_inner)/h = g, cell ghost
   * u_g = u₁ + 2h·g.
   */
  neumann: "central" | "one-sided";
  /** Factor applied to Neumann and Robin data g. */
  fluxDataScale: number;
  /** Sign of β in Robin conditions (−1: the inward normal derivative). */
  robinBetaSign: number;
  /** Whether e·u is kept in the first layer of unknowns next to the boundary. */
  reactionNearBoundary: boolean;
  /** Factor applied to the mixed term m·u_xy (non-conservative form). */
  mixedScale: number;
  /** Conservative form: sign in front of k12 in the cross fluxes k12·u_y and k12·u_x. */
  crossSign: number;
  /**
   * Conservative form: K at a face between two unknowns — the case's face value (`faceX`/`faceY`,
   * harmonic across an interface) or the arithmetic mean of K at the two unknowns ("arithmetic").
   */
  faceConductivity: "face" | "arithmetic";
  /**
   * Conservative form: Neumann data read as the conormal flux (K∇u)·n ("conormal") or as the normal
   * derivative ∂u/∂n, so the flux through the face is taken as k·g ("gradient").
   */
  neumannData: "conormal" | "gradient";
  /**
   * Robin weights α and β taken where the condition is imposed ("point") or once per side, at
   * the side's midpoint ("side-midpoint": a code that keeps one film coefficient per edge).
   */
  robinWeights: "point" | "side-midpoint";
  /**
   * Stretched and periodic grids (`assemble_mapped.ts`): the west neighbour of the first column
   * across a periodic seam — the last column inside the period ("wrap"), the image node nx of
   * node 0 itself on vertex grids ("image"), or none, the wrap-around term dropped as if the seam
   * were a zero-gradient side, on cell grids ("dropped").
   */
  periodicSeam: "wrap" | "image" | "dropped";
  /**
   * Stretched grids: the y differences on the real steps of the mapped lines ("mapped") or the
   * uniform three-point formula with the mean step (y1 − y0)/ny at the mapped points ("mean").
   */
  ySpacing: "mapped" | "mean";
}

/** The second-order central scheme the brief asks for. */
export const CORRECT_DISCRETIZATION: Discretization = {
  convectionXSign: 1,
  convectionY: "central",
  yySpacing: "hy",
  aShift: [0, 0],
  sourceShift: { vertex: [0, 0], cell: [0, 0] },
  dirichletShift: {},
  cellDirichlet: "reflect",
  neumann: "central",
  fluxDataScale: 1,
  robinBetaSign: 1,
  reactionNearBoundary: true,
  mixedScale: 1,
  crossSign: 1,
  faceConductivity: "face",
  neumannData: "conormal",
  robinWeights: "point",
  periodicSeam: "wrap",
  ySpacing: "mapped",
};

/** What a solve reports: values (x fastest unless a defect says otherwise) and its history. */
export interface Finished {
  values: Float64Array;
  residualHistory: number[];
  iterations: number;
  converged: boolean;
}

/** What a finishing step sees: the assembled system, its direct solution and the grid. */
export interface FinishContext {
  system: LinearSystem;
  direct: Finished;
  layout: "vertex" | "cell";
  /** Points along x and y (nx + 1, ny + 1 on vertex; nx, ny on cell). */
  mx: number;
  my: number;
  tolerance: number;
}

/** One seeded defect. */
export interface Defect {
  /** The bug in a sentence. */
  description: string;
  /** Where in the solver the bug sits, in words. */
  place: string;
  /** Layouts the defect exists on (default: both). */
  layouts?: readonly ("vertex" | "cell")[];
  /** Changes to the assembled scheme. */
  discretization?: Partial<Discretization>;
  /** A rewrite of the finished solve (stopped iterations, reordered or dropped values). */
  finish?: (context: FinishContext) => Finished;
}

/** Gauss–Seidel from zero to a relative residual, reported as converged whatever happened. */
function stopEarly(relative: number, maxSweeps: number): (context: FinishContext) => Finished {
  return ({ system }) => {
    const run = gaussSeidel(system, { relative, maxSweeps });
    return {
      values: run.u,
      residualHistory: run.history,
      iterations: run.sweeps,
      converged: true,
    };
  };
}

/** The defects by name. */
export const DEFECTS = {
  "neumann-one-sided": {
    description: "Neumann sides use a first-order one-sided difference: vertex rows " +
      "(u_boundary − u_inner)/h = g instead of the ghost-node closure; cell ghost u_g = u₁ + 2h·g",
    place: "the Neumann sides",
    discretization: { neumann: "one-sided" },
  },
  "robin-sign": {
    description: "Robin sides use the inward normal derivative (the sign of the β term flipped)",
    place: "the Robin sides",
    discretization: { robinBetaSign: -1 },
  },
  "dirichlet-shift": {
    description:
      "vertex: the north side's Dirichlet data is sampled one spacing inside (y1 − hy); " +
      "cell: the Dirichlet ghost takes the face value (u_g = g) instead of 2g − u₁",
    place: "the Dirichlet sides (vertex: the north side)",
    discretization: { dirichletShift: { north: [0, -1] }, cellDirichlet: "face-value" },
  },
  "convection-x-sign": {
    description: "the b·u_x term enters with the wrong sign",
    place: "the first-derivative term in x",
    discretization: { convectionXSign: -1 },
  },
  "convection-y-onesided": {
    description: "d·u_y uses the first-order forward difference (u_N − u_C)/hy",
    place: "the first-derivative term in y",
    discretization: { convectionY: "forward" },
  },
  "spacing-swap": {
    description: "the u_yy second difference divides by hx² instead of hy² (invisible on square " +
      "cells)",
    place: "the second-derivative term in y",
    discretization: { yySpacing: "hx" },
  },
  "coefficient-shift": {
    description: "coefficient a is sampled half a spacing east of the point, at (x + hx/2, y)",
    place: "the sampling of coefficient a",
    discretization: { aShift: [0.5, 0] },
  },
  "source-shift": {
    description:
      "the source is sampled at (x + hx/2, y + hy/2) on vertex grids and at the cell's " +
      "lower-left corner on cell grids",
    place: "the sampling of the source term",
    discretization: { sourceShift: { vertex: [0.5, 0.5], cell: [-0.5, -0.5] } },
  },
  "reaction-dropped-boundary": {
    description: "the reaction term e·u is left out of the rows of the first layer next to the " +
      "boundary",
    place: "the reaction term next to the boundary",
    discretization: { reactionNearBoundary: false },
  },
  "loose-tolerance-lie": {
    description:
      "after the direct solve the answer is replaced by a Gauss–Seidel iterate stopped " +
      "at relative residual 1e-3, reported as converged with its honest history",
    place: "the linear solver's stopping test",
    finish: stopEarly(1e-3, 100_000),
  },
  "stall-claims-converged": {
    description: "a few Gauss–Seidel sweeps (relative residual 1e-2) are reported as a converged " +
      "solve",
    place: "the linear solver's convergence flag",
    finish: stopEarly(1e-2, 10_000),
  },
  "transposed-output": {
    description: "the correct solution is written y fastest (index i·my + j) instead of x fastest",
    place: "the output ordering of the values",
    finish: ({ direct, mx, my }) => {
      const values = new Float64Array(direct.values.length);
      for (let j = 0; j < my; j++) {
        for (let i = 0; i < mx; i++) values[i * my + j] = direct.values[j * mx + i];
      }
      return { ...direct, values };
    },
  },
  "dropped-boundary-values": {
    description: "the solution on the south boundary row of nodes is written as 0",
    place: "the output of the south boundary values",
    layouts: ["vertex"],
    finish: ({ direct, mx }) => {
      const values = direct.values.slice();
      values.fill(0, 0, mx);
      return { ...direct, values };
    },
  },
  "single-level-work": {
    description:
      "the correct system is solved by plain lexicographic Gauss–Seidel from zero to the " +
      "task's tolerance (capped at 200000 sweeps), so the work grows far faster than the unknowns",
    place: "the linear solver's algorithm",
    finish: ({ system, tolerance }) => {
      const run = gaussSeidel(system, { relative: tolerance, maxSweeps: 200_000 });
      return {
        values: run.u,
        residualHistory: run.history,
        iterations: run.sweeps,
        converged: run.reached,
      };
    },
  },
  "neumann-half-flux": {
    description: "Neumann and Robin data g enter the flux term with half their value",
    place: "the Neumann and Robin sides",
    discretization: { fluxDataScale: 0.5 },
  },
  "mixed-term-halved": {
    description: "the mixed term m·u_xy enters with half its coefficient (the factor 2 of the " +
      "four-corner difference 1/(4·hx·hy) counted twice)",
    place: "the mixed-derivative term (m·u_xy)",
    discretization: { mixedScale: 0.5 },
  },
  "face-arithmetic-mean": {
    description: "conservative form: the conductivity at a face between two unknowns is the " +
      "arithmetic mean of K at those two points instead of the face value (harmonic across a jump); " +
      "invisible while K is smooth",
    place: "the conductivity at the faces (arithmetic instead of harmonic averaging)",
    discretization: { faceConductivity: "arithmetic" },
  },
  "cross-diffusion-sign": {
    description: "conservative form: k12 enters the cross fluxes k12·u_y (x-faces) and k12·u_x " +
      "(y-faces) with the wrong sign; invisible on isotropic and axis-aligned cases",
    place: "the cross-diffusion terms (k12)",
    discretization: { crossSign: -1 },
  },
  "neumann-gradient-data": {
    description: "conservative form: Neumann data g is read as ∂u/∂n, so the flux through the " +
      "side is taken as k·g instead of g (the conormal flux (K∇u)·n)",
    place: "the Neumann sides (their data is the conormal flux)",
    discretization: { neumannData: "gradient" },
  },
  "robin-weights-per-side": {
    description: "Robin weights α and β are read once per side, at its midpoint, and used along " +
      "the whole side; invisible while they are constant",
    place: "the Robin sides (their weights vary along the side)",
    discretization: { robinWeights: "side-midpoint" },
  },
  "periodic-seam-image": {
    description: "vertex: across the periodic seam the first node couples to node nx — its own " +
      "image, equal to it — instead of node nx − 1, the last node inside the period (the image " +
      "node counted as a neighbour)",
    place: "the periodic sides (the seam between west and east)",
    layouts: ["vertex"],
    discretization: { periodicSeam: "image" },
  },
  "periodic-seam-dropped": {
    description:
      "cell: the wrap-around term of the periodic seam is dropped — the first and last " +
      "cells see a zero-gradient side instead of each other",
    place: "the periodic sides (the seam between west and east)",
    layouts: ["cell"],
    discretization: { periodicSeam: "dropped" },
  },
  "stretched-y-mean-spacing": {
    description: "the y differences use the uniform three-point formula with the mean spacing " +
      "(y1 − y0)/ny at the mapped points, while x takes the real steps (stretching added for one " +
      "axis only)",
    place: "the stretched axis y (its differences assume equal steps)",
    discretization: { ySpacing: "mean" },
  },
} as const satisfies Record<string, Defect>;

/** The name of a seeded defect. */
export type DefectName = keyof typeof DEFECTS;
