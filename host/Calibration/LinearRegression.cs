using MathNet.Numerics.LinearRegression;

namespace FreqReadout.Host.Calibration;

/// <summary>Straight-line least squares: MathNet's <see cref="SimpleRegression"/> for the coefficients, the standard errors as in <see cref="LineFit"/>.</summary>
public static class LinearRegression
{
    /// <summary>Fits y = a + b x.</summary>
    /// <param name="x">Predictor values.</param>
    /// <param name="y">Responses, same length.</param>
    /// <param name="fit">The fit; default when false.</param>
    /// <param name="error">Why no fit is possible (fewer than 3 points, all x equal, lengths differ); null when true.</param>
    public static bool TryFit(IReadOnlyList<double> x, IReadOnlyList<double> y, out LineFit fit, out string? error)
    {
        fit = default;
        error = null;
        if (x.Count != y.Count)
        {
            error = $"x and y differ in length ({x.Count} and {y.Count})";
            return false;
        }

        int n = x.Count;
        if (n < 3)
        {
            error = $"a line with standard errors needs at least 3 points, got {n}";
            return false;
        }

        double[] xs = x.ToArray();
        double[] ys = y.ToArray();
        double xbar = xs.Average();
        double ybar = ys.Average();
        double sxx = 0;
        double syy = 0;
        for (int i = 0; i < n; i++)
        {
            sxx += (xs[i] - xbar) * (xs[i] - xbar);
            syy += (ys[i] - ybar) * (ys[i] - ybar);
        }

        if (!(sxx > 0))
        {
            error = "all x values are equal: the slope is undefined";
            return false;
        }

        (double a, double b) = SimpleRegression.Fit(xs, ys);
        double sse = 0;
        for (int i = 0; i < n; i++)
        {
            double r = ys[i] - a - (b * xs[i]);
            sse += r * r;
        }

        double s = Math.Sqrt(sse / (n - 2));
        double seB = s / Math.Sqrt(sxx);
        double seA = s * Math.Sqrt((1.0 / n) + (xbar * xbar / sxx));
        double r2 = syy > 0 ? 1 - (sse / syy) : double.NaN;
        fit = new LineFit(a, b, seA, seB, s, r2, n);
        return true;
    }
}
