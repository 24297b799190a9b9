namespace FreqReadout.Tests.Serial;

/// <summary>
/// A fact that needs <see cref="PseudoTerminalPair"/>: it runs on Linux and is reported as skipped, with the reason, on
/// every other system, so a run elsewhere shows that these tests did not run rather than passing them.
/// </summary>
public sealed class PseudoTerminalFactAttribute : FactAttribute
{
    /// <summary>Sets <see cref="FactAttribute.Skip"/> unless the tests run on Linux.</summary>
    public PseudoTerminalFactAttribute()
    {
        if (!PseudoTerminalPair.IsSupported)
        {
            Skip = PseudoTerminalPair.UnsupportedReason;
        }
    }
}
