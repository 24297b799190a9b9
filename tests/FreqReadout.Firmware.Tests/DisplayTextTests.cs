using FreqReadout.Detection;
using FreqReadout.Firmware.Device;
using FreqReadout.Readout;
using Xunit;

namespace FreqReadout.Firmware.Tests;

/// <summary>The status line says when the baseline capture was disturbed (issue 8, case 4).</summary>
public class DisplayTextTests
{
    private static Reading Make(bool disturbed, bool hasShift)
    {
        var r = new Reading();
        r.Set(hasShift ? ReadoutState.Tracking : ReadoutState.Settling, 10, 0.1, true, 100_000, hasShift, 100_000, 0.01, true, 0.1, 1, 0.01, 0, 0, false, false, false, TargetClass.None, disturbed);
        return r;
    }

    [Fact]
    public void A_disturbed_baseline_is_shown_while_recapturing_and_while_tracking_on_the_kept_one()
    {
        Assert.Contains("BASELINE MOVED", DisplayText.StatusLine(Make(true, false)));
        Assert.Contains("BASELINE MOVED", DisplayText.StatusLine(Make(true, true)));
        Assert.DoesNotContain("BASELINE MOVED", DisplayText.StatusLine(Make(false, true)));
    }
}
