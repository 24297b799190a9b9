using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// Test fake of a board's pulse counter and its microsecond timer (invented signal): the count of a steady signal at
/// <see cref="FrequencyHz"/> up to the simulated time, read as the ESP32 driver gives it (a 64-bit count); the test
/// moves the time and can make chosen reads race the driver's overflow interrupt (off by a span either way).
/// </summary>
internal sealed class SimulatedCounterBoard : IPulseCounterPort, IClockPort
{
    private readonly Dictionary<long, long> _readErrors = new();
    private long _readIndex;

    public SimulatedCounterBoard(double frequencyHz)
    {
        FrequencyHz = frequencyHz;
    }

    public double FrequencyHz { get; }

    public long NowMicroseconds { get; set; }

    /// <summary>Adds <paramref name="countError"/> to the read number <paramref name="readIndex"/> (0-based).</summary>
    public void MisreadAt(long readIndex, long countError) => _readErrors[readIndex] = countError;

    public bool TryReadNow(out ulong rawTick)
    {
        rawTick = (ulong)NowMicroseconds;
        return true;
    }

    public bool TryReadSnapshot(out ulong count, out ulong timeTicks)
    {
        long trueCount = (long)Math.Floor(FrequencyHz * NowMicroseconds * 1e-6);
        _readErrors.TryGetValue(_readIndex++, out long error);
        count = (ulong)(trueCount + error);
        timeTicks = (ulong)NowMicroseconds;
        return true;
    }
}
