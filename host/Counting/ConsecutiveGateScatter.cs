using FreqReadout.Counting;

namespace FreqReadout.Host.Counting;

/// <summary>
/// The measured scatter of consecutive gates, an Allan-style figure:
/// scatter = sqrt(sum_k (f_k - f_(k-1))^2 / (2 M)) over the last M &lt;= <see cref="Window"/> pairs of
/// consecutive gates (the second gate opens on the first's closing edge), Hz. For independent gate
/// errors of standard deviation sigma, E[(f_k - f_(k-1))^2] = 2 sigma^2, so the figure estimates sigma
/// (the normaliser 1/2 is the Allan variance's; Allan 1966, from memory). Slow drift adds only its small gate-to-gate step; a target passing by raises it,
/// which is why the readout never uses it as the detection sigma (a target would deafen detection):
/// it is a report beside the predicted error_hz. Empty input: null until two consecutive gates with a
/// frequency; a gate without a frequency (no signal) or one that does not open on the previous gate's
/// closing edge (after a dropout) starts it afresh. No allocation per gate.
/// </summary>
public sealed class ConsecutiveGateScatter
{
    /// <summary>Pairs of consecutive gates in the window (16).</summary>
    public const int Window = 16;

    private readonly double[] _squares = new double[Window];
    private int _count;
    private int _next;
    private bool _hasPrevious;
    private double _previousHz;
    private long _previousEndTick;

    /// <summary>Adds the next gate (in order) and returns the scatter after it; null while it is undefined.</summary>
    /// <param name="gate">The gate just closed.</param>
    /// <returns>The scatter in Hz over the window, or null (fewer than two consecutive gates with a frequency).</returns>
    public double? Add(GateResult gate)
    {
        if (!gate.HasFrequency)
        {
            Reset();
            return null;
        }

        if (_hasPrevious && gate.StartTick == _previousEndTick)
        {
            double d = gate.FrequencyHz - _previousHz;
            if (_count < Window)
            {
                _count++;
            }

            _squares[_next] = d * d;
            _next = (_next + 1) % Window;
        }
        else if (_hasPrevious)
        {
            Reset();
        }

        _hasPrevious = true;
        _previousHz = gate.FrequencyHz;
        _previousEndTick = gate.EndTick;
        if (_count == 0)
        {
            return null;
        }

        double sum = 0;
        for (int k = 0; k < _count; k++)
        {
            sum += _squares[k];
        }

        return Math.Sqrt(sum / (2.0 * _count));
    }

    /// <summary>Forgets every gate.</summary>
    public void Reset()
    {
        _count = 0;
        _next = 0;
        _hasPrevious = false;
        Array.Clear(_squares);
    }
}
