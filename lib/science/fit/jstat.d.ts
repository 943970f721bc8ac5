// Types for the part of jstat 1.9.6 that Gatewell uses (the package ships none).
declare module 'jstat' {
  interface StudentT {
    /** Quantile: x with P(T ≤ x) = p for Student's t with `dof` degrees of freedom. */
    inv(p: number, dof: number): number;
    cdf(x: number, dof: number): number;
  }
  const jStat: { studentt: StudentT };
  export default jStat;
}
