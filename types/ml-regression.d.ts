// ml-regression ships no type declarations; only what Rheoledger uses is declared here.
declare module "ml-regression" {
  export class SimpleLinearRegression {
    constructor(x: number[], y: number[]);
    slope: number;
    intercept: number;
    predict(x: number): number;
    score(x: number[], y: number[]): { r: number; r2: number; chi2: number; rmsd: number };
  }
  export class PolynomialRegression {
    constructor(x: number[], y: number[], degree: number | number[]);
    coefficients: number[];
    powers: number[];
    predict(x: number): number;
    score(x: number[], y: number[]): { r: number; r2: number; chi2: number; rmsd: number };
  }
}
