/**
 * A cross-case reading of a solver's failures: which ingredient (a boundary kind on a side, a
 * periodic pair, a stretched axis, an operator term, a variable coefficient, a full conductivity
 * tensor, material interfaces, non-square cells) is present in every case whose order
 * failed and absent from every case whose order passed — or from all but a few of them (at most a
 * quarter, at least one), which are named: a defect does not act where its ingredient's data
 * vanish. It adds a diagnosis to the failing
 * studies and their order verdicts' reasons; it never changes a verdict.
 *
 * @module
 */
import { hasInterfaces } from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import type { SideName, StudyRecord } from "../result/mod.ts";

/** One ingredient of a case, in the trade's words. */
interface Ingredient {
  key: string;
  words: string;
}

const SIDES: SideName[] = ["west", "east", "south", "north"];
const KIND_WORD: Record<string, string> = {
  dirichlet: "Dirichlet",
  neumann: "Neumann",
  robin: "Robin",
};

/** The ingredients of a case, each named in the trade's words and the case's symbols. */
export function ingredients(kase: CompiledCase): Ingredient[] {
  const out: Ingredient[] = [];
  if (SIDES.some((s) => kase.boundary[s].kind === "neumann" || kase.boundary[s].kind === "robin")) {
    out.push({ key: "derivative", words: "a Neumann or Robin side" });
  }
  // a periodic pair and a stretched axis live in their own code paths of a solver (the seam's
  // wrap-around, the differences on unequal steps), so each is an ingredient of its own
  for (const [lo, hi] of [["west", "east"], ["south", "north"]] as const) {
    if (kase.boundary[lo].kind === "periodic") {
      out.push({
        key: `periodic:${lo}`,
        words: `the periodic sides, the seam between ${lo} and ${hi}`,
      });
    }
  }
  const stretched = (["x", "y"] as const).filter((axis) => {
    const m = kase.mappings?.[axis];
    return m !== undefined && m.kind !== "uniform";
  });
  if (stretched.length > 0) out.push({ key: "stretched-any", words: "a stretched grid family" });
  for (const axis of stretched) {
    out.push({
      key: `stretched:${axis}`,
      words: `a grid stretched along ${axis} (unequal steps on the mapped lines)`,
    });
  }
  for (const kind of ["dirichlet", "neumann", "robin"]) {
    const sides = SIDES.filter((s) => kase.boundary[s].kind === kind);
    if (sides.length > 0) out.push({ key: kind, words: `a ${KIND_WORD[kind]} side` });
    for (const s of sides) {
      out.push({ key: `${kind}:${s}`, words: `the ${KIND_WORD[kind]} condition on the ${s} side` });
    }
  }
  if (SIDES.some((s) => kase.boundary[s].weightsVary === true)) {
    out.push({ key: "robin-varying", words: "Robin weights that vary along a side (α, β)" });
  }
  const constant = kase.constantCoefficients;
  const present = (k: "b" | "d" | "e") => constant[k] !== 0;
  if (present("b")) out.push({ key: "b", words: "the first-derivative term in x (b·u_x)" });
  if (present("d")) out.push({ key: "d", words: "the first-derivative term in y (d·u_y)" });
  if (present("e")) out.push({ key: "e", words: "the reaction term (e·u)" });
  if (constant.a === undefined) {
    out.push({ key: "a", words: "the variable coefficient of u_xx (a)" });
  }
  if (constant.c === undefined) {
    out.push({ key: "c", words: "the variable coefficient of u_yy (c)" });
  }
  // the conservative form's k12 and the non-conservative m live in different code paths of a
  // solver (cross fluxes at faces against a four-corner difference), so they are told apart
  if (kase.form === "conservative") {
    if (kase.conservative && kase.conservative.constant.k12 !== 0) {
      out.push({
        key: "k12",
        words: "the cross-diffusion terms of a full conductivity tensor (k12)",
      });
    }
  } else if (constant.m !== 0) {
    out.push({ key: "m", words: "the mixed-derivative term (m·u_xy)" });
  }
  if (hasInterfaces(kase.interfaces)) {
    out.push({ key: "interfaces", words: "material interfaces (a conductivity that jumps)" });
  }
  const { x0, x1, y0, y1 } = kase.domain;
  const g = kase.gridFor(64);
  const hx = (x1 - x0) / g.nx, hy = (y1 - y0) / g.ny;
  if (Math.abs(hx / hy - 1) > 1e-9) out.push({ key: "cells", words: "non-square cells (hx ≠ hy)" });
  return out;
}

function orderOutcome(study: StudyRecord): "fail" | "pass" | null {
  const judged = study.verdicts.filter((v) =>
    v.criterion === "order" || v.criterion === "exactness"
  );
  if (judged.some((v) => v.status === "fail")) return "fail";
  if (
    judged.length > 0 && judged.every((v) => v.status === "pass" || v.status === "not-applicable")
  ) {
    return judged.some((v) => v.status === "pass") ? "pass" : null;
  }
  return null;
}

/**
 * For each solver with failing and passing studies, finds the ingredients shared by every failing
 * case and absent from every passing one, and writes the finding into the failing studies'
 * `diagnosis` and their first failing order or exactness verdict.
 *
 * @param studies The campaign's studies (changed in place: diagnosis and reasons only).
 * @param cases The cases, by id.
 */
export function diagnoseAcrossCases(studies: StudyRecord[], cases: CompiledCase[]): void {
  const byId = new Map(cases.map((c) => [c.id, c]));
  const solvers = [...new Set(studies.map((s) => s.solver))];
  for (const solver of solvers) {
    const mine = studies.filter((s) => s.solver === solver && byId.has(s.caseId));
    const failing = mine.filter((s) => orderOutcome(s) === "fail");
    const passing = mine.filter((s) => orderOutcome(s) === "pass");
    if (failing.length === 0 || passing.length === 0) continue;
    const of = (s: StudyRecord) => ingredients(byId.get(s.caseId)!);
    const inFailing = of(failing[0]).filter((i) =>
      failing.every((s) => of(s).some((j) => j.key === i.key))
    );
    // How many passing cases share each ingredient of every failing case: the fewest separate
    // best. A side-level ingredient adds nothing over its kind when both share the same cases.
    const scored = inFailing.map((i) => ({
      i,
      also: passing.filter((s) => of(s).some((j) => j.key === i.key)),
    }));
    const fewest = Math.min(...scored.map((x) => x.also.length));
    const best = scored.filter((x) => x.also.length === fewest).filter((x, _, all) => {
      const kind = x.i.key.split(":")[0];
      return !(x.i.key.includes(":") && all.some((y) => y.i.key === kind));
    }).filter((x, _, all) =>
      // "a Neumann or Robin side" only when neither kind alone does as well
      x.i.key !== "derivative" || !all.some((y) => y.i.key === "neumann" || y.i.key === "robin")
    ).filter((x, _, all) =>
      // a stretched family in general only when no one axis does as well (the axis says where)
      x.i.key !== "stretched-any" || !all.some((y) => y.i.key.startsWith("stretched:"))
    );
    const fl = failing.map((s) => s.caseId).join(", ");
    const pl = passing.map((s) => s.caseId).join(", ");
    const words = best.map((x) => x.i.words);
    let text: string;
    if (inFailing.length === 0) {
      text = `across the campaign, the cases where ${solver} fails the order (${fl}) share no ` +
        `boundary kind, operator term or cell shape that the passing ones (${pl}) lack`;
    } else if (fewest === 0) {
      text = `across the campaign, ${solver} fails the order on every case with ${
        words.join(" and with ")
      } (${fl}) and passes it on every case without (${pl}): the defect most likely lies with ${
        words.join(" or ")
      }`;
    } else if (fewest <= Math.max(1, Math.floor(passing.length / 4))) {
      const also = best[0].also.map((s) => s.caseId).join(", ");
      text =
        `across the campaign, every case where ${solver} fails the order (${fl}) has ${
          words.join(" and ")
        }; of the ${passing.length} cases where it passes only ${also} ${
          fewest === 1 ? "has" : "have"
        } it too (where the defect may not act, e.g. when the data there vanish): the defect ` +
        `most likely lies with ${words.join(" or ")}`;
    } else {
      text = `across the campaign, every case where ${solver} fails the order (${fl}) has ${
        inFailing.map((i) => i.words).join(", ")
      }, but so do cases where it passes (${pl}): no single ingredient explains the failures`;
    }
    for (const s of failing) {
      s.diagnosis = text;
      const v = s.verdicts.find((v) =>
        (v.criterion === "order" || v.criterion === "exactness") && v.status === "fail"
      );
      if (v) v.reason += `. ${text[0].toUpperCase()}${text.slice(1)}`;
    }
  }
}
