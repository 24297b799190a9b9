namespace FreqReadout.Tests.DeviceFit;

/// <summary>The constants that turn IL counts into time. Each is an assumption until a board measures it.</summary>
internal sealed class CostAssumptions
{
    /// <summary>
    /// One call into mscorlib (string building, number formatting, double.IsNaN, Monitor): counted as
    /// this many simple IL operations whatever it does. Assumption, no source: most of them are native
    /// in nanoCLR; formatting a double costs more, a flag test less.
    /// </summary>
    public long MscorlibCallOps { get; init; } = 50;

    /// <summary>One call of a port interface (the board adapter reading a pin, the timer, the pulse counter, the display). Assumption, no source.</summary>
    public long PortCallOps { get; init; } = 50;

    /// <summary>Simple IL operations nanoCLR interprets per second, low figure (ESP32; the project's rough figure, not measured on a board).</summary>
    public double LowOpsPerSecond { get; init; } = 1.0e6;

    /// <summary>Simple IL operations nanoCLR interprets per second, high figure (same source as the low one).</summary>
    public double HighOpsPerSecond { get; init; } = 5.0e6;
}
