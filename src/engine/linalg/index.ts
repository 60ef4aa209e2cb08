// Dense linear algebra of the small-signal engine: LU solves and the generalized eigen solver.
export * from './lu';
export { balancePencil, unbalanceRight, unbalanceLeft, type BalancedPencil } from './balance';
export {
  generalizedEigenvalues, finiteEigenvalues, REFINE_ABOVE,
  type GenEigResult, type FiniteEigenvalues,
} from './qz';
export { eigenvectorPair, type EigenvectorPair } from './eigvec';
