import { describe, expect, it } from "vitest";
import { correctedRatioEstimates } from "@/lib/sampling/ratio-corrected";

// A fixed sample of 8 from N = 40 items with book total X = 4,200 (invented for the test).
const x = [120, 80, 150, 60, 200, 95, 130, 70];
const y = [118, 80, 140, 60, 195, 95, 126, 66];
const sample = x.map((bookValue, i) => ({ bookValue, auditedValue: y[i] }));
const r = correctedRatioEstimates({ sample, populationSize: 40, populationBookValue: 4200 });

describe("bias-corrected ratio estimators on a fixed sample (numpy 2.4.6 computation quoted)", () => {
  it("plain ratio: R̂·X = 4,083.9779, SE 35.5387 (Cochran 1977 eq. 6.9)", () => {
    // numpy: y.sum()/x.sum()*X; sqrt(N²(1−f)/n · Σ(y − R̂x)²/(n − 1))
    expect(r.ratio!.estimate).toBeCloseTo(4083.977900552486, 8);
    expect(r.ratio!.standardError).toBeCloseTo(35.53867196259129, 8);
  });

  it("Hartley–Ross: r̄X + n(N − 1)/(n − 1)(ȳ − r̄x̄) = 4,081.3726, SE 36.1535 (Cochran §6.8)", () => {
    // numpy: r = mean(y/x); r*X + n*(N-1)/(n-1)*(y.mean() - r*x.mean()); sqrt(N²(1−f)/n (s_y² + r²s_x² − 2r s_xy))
    expect(r["hartley-ross"]!.estimate).toBeCloseTo(4081.3726206828887, 8);
    expect(r["hartley-ross"]!.standardError).toBeCloseTo(36.153480243747, 8);
  });

  it("jackknife (Quenouille): (nR̂ − (n − 1)·mean R̂_(−j))·X = 4,082.2901, SE 33.5990 (Cochran §6.9)", () => {
    // numpy: loo = [(Σy − y_j)/(Σx − x_j)]; (n R − (n−1) loo.mean()) X; sqrt(X²(1−f)(n−1)/n Σ(loo − mean)²)
    expect(r["jackknife-ratio"]!.estimate).toBeCloseTo(4082.290095639945, 8);
    expect(r["jackknife-ratio"]!.standardError).toBeCloseTo(33.598950870541806, 8);
  });

  it("Beale: R̂(1 + θc_xy)/(1 + θc_xx)·X = 4,082.6507; Tin: R̂(1 + θ(c_xy − c_xx))·X = 4,082.6279 (Cochran §6.9)", () => {
    // numpy with θ = (1 − 8/40)/8, c_xy = s_xy/(x̄ȳ), c_xx = s_x²/x̄² (ddof = 1)
    expect(r["beale-ratio"]!.estimate).toBeCloseTo(4082.6506864995417, 8);
    expect(r["tin-ratio"]!.estimate).toBeCloseTo(4082.6279488429595, 8);
    expect(r["beale-ratio"]!.standardError).toBeCloseTo(35.53867196259129, 8); // the ratio estimator's variance
  });

  it("Hartley–Ross is exactly unbiased: its mean over all C(6, 3) = 20 samples equals the true total", () => {
    // By enumeration (the definition of unbiasedness under simple random sampling without replacement).
    const bx = [50, 120, 80, 300, 45, 210];
    const by = [48, 120, 70, 310, 45, 190];
    const X = bx.reduce((a, b) => a + b, 0);
    const Y = by.reduce((a, b) => a + b, 0);
    let hr = 0,
      ratio = 0,
      jack = 0,
      count = 0;
    for (let a = 0; a < 6; a++)
      for (let b = a + 1; b < 6; b++)
        for (let c = b + 1; c < 6; c++) {
          const s = [a, b, c].map((i) => ({ bookValue: bx[i], auditedValue: by[i] }));
          const e = correctedRatioEstimates({ sample: s, populationSize: 6, populationBookValue: X });
          hr += e["hartley-ross"]!.estimate;
          ratio += e.ratio!.estimate;
          jack += e["jackknife-ratio"]!.estimate;
          count++;
        }
    expect(count).toBe(20);
    expect(hr / count).toBeCloseTo(Y, 9);
    expect(Math.abs(ratio / count - Y)).toBeGreaterThan(0.01); // the plain ratio estimator is biased here
    expect(Math.abs(jack / count - Y)).toBeLessThan(Math.abs(ratio / count - Y)); // the jackknife removes most of it
  });

  it("leaves Hartley–Ross undefined (null) when a sampled book value is zero, and every ratio form when the sample's book total is zero", () => {
    const withZero = correctedRatioEstimates({
      sample: [{ bookValue: 0, auditedValue: 0 }, ...sample],
      populationSize: 40,
      populationBookValue: 4200,
    });
    expect(withZero["hartley-ross"]).toBeNull();
    expect(withZero["jackknife-ratio"]).not.toBeNull();
    const zeroTotal = correctedRatioEstimates({
      sample: [
        { bookValue: 100, auditedValue: 90 },
        { bookValue: -100, auditedValue: -100 },
      ],
      populationSize: 40,
      populationBookValue: 4200,
    });
    expect(zeroTotal.ratio).toBeNull();
    expect(zeroTotal["tin-ratio"]).toBeNull();
  });
});
