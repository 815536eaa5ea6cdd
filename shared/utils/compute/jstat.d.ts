// jstat ships no types; this declares only the parts the computation module uses.
declare module 'jstat' {
  interface JStatStatic {
    chisquare: {
      inv(p: number, dof: number): number
      cdf(x: number, dof: number): number
    }
    normal: {
      inv(p: number, mean: number, sd: number): number
    }
    /** Regularized incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number
  }
  const jStat: JStatStatic
  export default jStat
}
