/**
 * Straight-line fits of pressure against time over any window of a step in O(1) each, from
 * running sums (ordinary least squares; e.g. Montgomery & Runger, Applied Statistics and
 * Probability for Engineers, ch. 11). Time and pressure are taken relative to the step's first
 * sample to keep the sums well conditioned.
 *
 *   slope b = Sxy/Sxx, residual variance s² = (Syy − Sxy²/Sxx)/(n − 2),
 *   SE(b) = s/√Sxx, sample standard deviation about the mean sd = √(Syy/(n − 1)).
 */

/** A line through one window. SI units (s, Pa). */
export interface WindowFit {
  /** number of samples */
  samples: number;
  /** first and last sample time, s */
  start: number;
  end: number;
  /** mean pressure, Pa */
  mean: number;
  /** sample standard deviation about the mean, Pa */
  sd: number;
  /** slope of pressure against time, Pa/s */
  slope: number;
  /** standard deviation of the residuals about the line (the noise), Pa */
  noise: number;
  /** standard error of the slope, Pa/s */
  slopeError: number;
}

/** Running sums of one step, for {@link WindowSums.fit}. */
export class WindowSums {
  private readonly t0: number;
  private readonly p0: number;
  private readonly st: Float64Array;
  private readonly stt: Float64Array;
  private readonly sp: Float64Array;
  private readonly spp: Float64Array;
  private readonly stp: Float64Array;

  /**
   * @param time sample times, s (increasing)
   * @param pressure samples, Pa
   * @param from first index of the step; @param to last index (inclusive)
   */
  constructor(
    private readonly time: ArrayLike<number>,
    pressure: ArrayLike<number>,
    private readonly from: number,
    to: number,
  ) {
    const n = to - from + 1;
    this.t0 = time[from] as number;
    this.p0 = pressure[from] as number;
    this.st = new Float64Array(n + 1);
    this.stt = new Float64Array(n + 1);
    this.sp = new Float64Array(n + 1);
    this.spp = new Float64Array(n + 1);
    this.stp = new Float64Array(n + 1);
    for (let k = 0; k < n; k++) {
      const t = (time[from + k] as number) - this.t0;
      const p = (pressure[from + k] as number) - this.p0;
      this.st[k + 1] = (this.st[k] as number) + t;
      this.stt[k + 1] = (this.stt[k] as number) + t * t;
      this.sp[k + 1] = (this.sp[k] as number) + p;
      this.spp[k + 1] = (this.spp[k] as number) + p * p;
      this.stp[k + 1] = (this.stp[k] as number) + t * p;
    }
  }

  /** The line through samples [a, b] (absolute indices, inclusive; at least 3 samples). */
  fit(a: number, b: number): WindowFit {
    const i = a - this.from;
    const j = b - this.from + 1;
    const n = j - i;
    const d = (s: Float64Array) => (s[j] as number) - (s[i] as number);
    const st = d(this.st);
    const sp = d(this.sp);
    const sxx = Math.max(0, d(this.stt) - (st * st) / n);
    const syy = Math.max(0, d(this.spp) - (sp * sp) / n);
    const sxy = d(this.stp) - (st * sp) / n;
    const slope = sxx > 0 ? sxy / sxx : 0;
    const residual = Math.max(0, syy - (sxx > 0 ? (sxy * sxy) / sxx : 0));
    const noise = n > 2 ? Math.sqrt(residual / (n - 2)) : 0;
    return {
      samples: n,
      start: this.time[a] as number,
      end: this.time[b] as number,
      mean: this.p0 + sp / n,
      sd: n > 1 ? Math.sqrt(syy / (n - 1)) : 0,
      slope,
      noise,
      slopeError: sxx > 0 ? noise / Math.sqrt(sxx) : Infinity,
    };
  }
}
