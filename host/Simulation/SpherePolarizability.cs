using System.Numerics;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// Magnetic polarizability M (m^3, complex, time factor e^{+i w t}) of a conducting, permeable sphere in a uniform
/// alternating field: induced dipole m = M H. Closed form of J. R. Wait, Geophysics 16:666, 1951, as written in
/// Ledger and Lionheart's polarizability papers:
/// M = 2 pi a^3 [2(mu - mu0) j0(ka) + (2 mu + mu0) j2(ka)] / [(mu + 2 mu0) j0(ka) + (mu - mu0) j2(ka)],
/// k = sqrt(-i w mu sigma) = (1 - i)/delta. Computed through the ratio j2/j0 = 3/z^2 - 1 - 3 cot(z)/z, with cot(z)
/// evaluated from exp(-2 i z) so it never overflows (for large |z| it tends to i, the asymptotic form), and by the power
/// series for |z| &lt; 1.
/// </summary>
public static class SpherePolarizability
{
    /// <summary>Skin depth delta = sqrt(2 / (w mu sigma)), m. f, sigma, mu_r &gt; 0.</summary>
    public static double SkinDepthM(double frequencyHz, double conductivitySPerM, double relativePermeability)
    {
        double w = 2.0 * Math.PI * frequencyHz;
        return Math.Sqrt(2.0 / (w * relativePermeability * PhysicalConstants.Mu0HPerM * conductivitySPerM));
    }

    /// <summary>M / (2 pi a^3) (dimensionless). f = 0 gives the static limit 2 (mu_r - 1)/(mu_r + 2).</summary>
    public static Complex Normalised(double radiusM, double conductivitySPerM, double relativePermeability, double frequencyHz)
    {
        if (!(radiusM > 0) || !(conductivitySPerM >= 0) || !(relativePermeability >= 1.0) || !(frequencyHz >= 0))
        {
            throw new ArgumentOutOfRangeException(nameof(radiusM), "sphere needs radius > 0, conductivity >= 0, mu_r >= 1, frequency >= 0");
        }

        double mur = relativePermeability;
        if (frequencyHz == 0 || conductivitySPerM == 0)
        {
            return new Complex(LowFrequencyLimit(mur), 0.0);
        }

        double delta = SkinDepthM(frequencyHz, conductivitySPerM, mur);
        double x = radiusM / delta;
        var z = new Complex(x, -x); // k a = (1 - i) a / delta
        Complex ratio = BesselRatioJ2OverJ0(z);
        // mu and mu0 in units of mu0.
        return (2.0 * (mur - 1.0) + (2.0 * mur + 1.0) * ratio) / ((mur + 2.0) + (mur - 1.0) * ratio);
    }

    /// <summary>M = 2 pi a^3 times <see cref="Normalised"/>, m^3.</summary>
    public static Complex PolarizabilityM3(double radiusM, double conductivitySPerM, double relativePermeability, double frequencyHz)
    {
        return 2.0 * Math.PI * radiusM * radiusM * radiusM * Normalised(radiusM, conductivitySPerM, relativePermeability, frequencyHz);
    }

    /// <summary>Non-magnetic closed form M / (2 pi a^3) = -[1 - 3/(ka)^2 + 3 cot(ka)/(ka)] (Wait 1951), with the same stable cot.</summary>
    public static Complex NormalisedNonMagnetic(double radiusM, double conductivitySPerM, double frequencyHz)
    {
        double delta = SkinDepthM(frequencyHz, conductivitySPerM, 1.0);
        double x = radiusM / delta;
        var z = new Complex(x, -x);
        if (z.Magnitude < 1.0)
        {
            return BesselRatioJ2OverJ0(z);
        }

        return -(1.0 - 3.0 / (z * z) + 3.0 * StableCot(z) / z);
    }

    /// <summary>w -&gt; 0 limit of M / (2 pi a^3): 2 (mu_r - 1) / (mu_r + 2).</summary>
    public static double LowFrequencyLimit(double relativePermeability)
    {
        return 2.0 * (relativePermeability - 1.0) / (relativePermeability + 2.0);
    }

    /// <summary>w -&gt; infinity limit of M / (2 pi a^3): -1 (field fully excluded).</summary>
    public const double HighFrequencyLimit = -1.0;

    /// <summary>
    /// Ferrous crossover frequency (Re M = 0), Hz, by bracketing on a logarithmic frequency grid and Brent's method
    /// (MathNet.Numerics.RootFinding.Brent) to 1e-10 relative. Returns NaN when mu_r &lt;= 1 (no crossover: Re M &lt; 0 at all f).
    /// The docs/references.md estimate f_x ~ 1.641 mu_r / (pi mu0 sigma a^2) is <see cref="CrossoverEstimateHz"/>.
    /// </summary>
    public static double CrossoverFrequencyHz(double radiusM, double conductivitySPerM, double relativePermeability)
    {
        if (!(relativePermeability > 1.0) || !(conductivitySPerM > 0))
        {
            return double.NaN;
        }

        double estimate = CrossoverEstimateHz(radiusM, conductivitySPerM, relativePermeability);
        double RealPart(double logF) => Normalised(radiusM, conductivitySPerM, relativePermeability, Math.Exp(logF)).Real;
        double lo = Math.Log(estimate) - Math.Log(1e4);
        double loValue = RealPart(lo);
        if (!(loValue > 0))
        {
            lo = Math.Log(1e-6);
            loValue = RealPart(lo);
        }

        // Walk up by factors of 2 from the low end until Re M changes sign.
        double step = Math.Log(2.0);
        for (int i = 0; i < 200; i++)
        {
            double hi = lo + step;
            double hiValue = RealPart(hi);
            if (hiValue <= 0)
            {
                double root = MathNet.Numerics.RootFinding.Brent.FindRoot(RealPart, lo, hi, 1e-12, 200);
                return Math.Exp(root);
            }

            lo = hi;
        }

        return double.NaN;
    }

    /// <summary>Approximate crossover f_x ~ 1.641 mu_r / (pi mu0 sigma a^2), Hz (docs/references.md, valid for mu_r &gt;&gt; 1).</summary>
    public static double CrossoverEstimateHz(double radiusM, double conductivitySPerM, double relativePermeability)
    {
        return 1.641 * relativePermeability / (Math.PI * PhysicalConstants.Mu0HPerM * conductivitySPerM * radiusM * radiusM);
    }

    /// <summary>
    /// j2(z)/j0(z) for complex z. |z| &lt; 1: ratio of the power series j_n(z) = z^n sum_k (-z^2/2)^k / (k! (2n+2k+1)!!);
    /// otherwise 3/z^2 - 1 - 3 cot(z)/z with the overflow-free cot.
    /// </summary>
    public static Complex BesselRatioJ2OverJ0(Complex z)
    {
        if (z.Magnitude < 1.0)
        {
            Complex j0 = SeriesJ(0, z);
            Complex j2 = SeriesJ(2, z);
            return j2 / j0;
        }

        return 3.0 / (z * z) - 1.0 - 3.0 * StableCot(z) / z;
    }

    /// <summary>
    /// cot z = i (1 + w)/(1 - w) with w = exp(-2 i z) when Im z &lt; 0 (|w| &lt; 1), and -i (1 + w)/(1 - w) with w = exp(2 i z)
    /// when Im z &gt; 0. For |w| below 1e-300 this is the asymptotic value +-i. Real z uses Complex.Cos/Sin.
    /// </summary>
    public static Complex StableCot(Complex z)
    {
        if (z.Imaginary == 0)
        {
            return Complex.Cos(z) / Complex.Sin(z);
        }

        bool lower = z.Imaginary < 0;
        double wMagnitudeLog = lower ? 2.0 * z.Imaginary : -2.0 * z.Imaginary; // log |w|
        Complex sign = lower ? Complex.ImaginaryOne : -Complex.ImaginaryOne;
        if (wMagnitudeLog < -690.0)
        {
            return sign;
        }

        Complex w = lower ? Complex.Exp(new Complex(2.0 * z.Imaginary, -2.0 * z.Real)) : Complex.Exp(new Complex(-2.0 * z.Imaginary, 2.0 * z.Real));
        return sign * (1.0 + w) / (1.0 - w);
    }

    private static Complex SeriesJ(int n, Complex z)
    {
        // z^n / (2n+1)!! * sum_k (-z^2/2)^k / (k! (2n+3)(2n+5)...(2n+2k+1))
        double doubleFactorial = 1.0;
        for (int i = 3; i <= 2 * n + 1; i += 2)
        {
            doubleFactorial *= i;
        }

        Complex u = -z * z / 2.0;
        Complex term = Complex.One;
        Complex sum = Complex.One;
        for (int k = 1; k < 40; k++)
        {
            term *= u / (k * (2.0 * n + 2.0 * k + 1.0));
            sum += term;
            if (term.Magnitude < 1e-18 * sum.Magnitude)
            {
                break;
            }
        }

        return Complex.Pow(z, n) / doubleFactorial * sum;
    }
}
