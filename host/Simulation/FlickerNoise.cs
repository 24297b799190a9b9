using System.Runtime.CompilerServices;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// A flicker-like fractional frequency noise: the sum of five first-order Gauss-Markov (Ornstein-Uhlenbeck) processes with
/// time constants 0.1, 1, 10, 100 and 1000 s and equal variance. With per-process standard deviation 1.30 F the sum's Allan
/// deviation is flat at about F from 0.3 s to 1000 s (within about 5 %; the factor 1/0.77 from the OU Allan variance
/// v tau_c^2/tau^2 (2 tau/tau_c - 3 + 4 e^(-tau/tau_c) - e^(-2 tau/tau_c)), summed). Starts at 0 (the nominal frequency).
/// </summary>
public sealed class FlickerNoise
{
    private static readonly double[] TimeConstantsS = { 0.1, 1.0, 10.0, 100.0, 1000.0 };
    private readonly double[] _state = new double[5];
    private readonly double[] _decay = new double[5];
    private readonly double[] _drive = new double[5];
    private readonly SimulationRandom _random;

    /// <summary>Creates the process for a floor <paramref name="floorAdev"/> updated every <paramref name="stepS"/> seconds.</summary>
    public FlickerNoise(double floorAdev, double stepS, SimulationRandom random)
    {
        _random = random;
        double sigma = floorAdev / 0.77;
        for (int i = 0; i < 5; i++)
        {
            _decay[i] = Math.Exp(-stepS / TimeConstantsS[i]);
            _drive[i] = sigma * Math.Sqrt(1.0 - _decay[i] * _decay[i]);
        }

        Enabled = floorAdev > 0;
    }

    /// <summary>False when the floor is 0 (then <see cref="Step"/> returns 0 and draws nothing).</summary>
    public bool Enabled { get; }

    /// <summary>Advances one step (exact OU discretisation x = x e^(-dt/tau) + sigma sqrt(1 - e^(-2 dt/tau)) N) and returns the fractional frequency.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Step()
    {
        if (!Enabled)
        {
            return 0.0;
        }

        double sum = 0;
        for (int i = 0; i < 5; i++)
        {
            _state[i] = _state[i] * _decay[i] + _drive[i] * _random.NextGaussian();
            sum += _state[i];
        }

        return sum;
    }
}
