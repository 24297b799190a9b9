namespace FreqReadout.Host.Reports;

/// <summary>
/// The safety cautions every report page shows (the CLI's caution of <c>replay</c> and <c>demo</c>, and
/// hardware-notes/safety.md "Before drilling, cutting or digging").
/// </summary>
public static class ReportCautions
{
    /// <summary>The cautions, one paragraph each.</summary>
    public static IReadOnlyList<string> BeforeDrillingCuttingOrDigging { get; } = new[]
    {
        "A readout that shows nothing is not proof that a wall or floor holds no live wiring or pipe. A small oscillator detector misses deep, thin, shielded or badly oriented conductors, reads large iron as non-ferrous above its crossover frequency, and says nothing about whether a conductor is live.",
        "Isolate the circuits in the work area and verify they are dead with an approved voltage tester (tested on a known live source before and after) before drilling or cutting.",
        "Check utility records and use the local locating or \"call before you dig\" service before digging; hand-dig near marked services.",
        "Follow local electrical and building codes and licensed practice. Where those codes require a licensed electrician, plumber or surveyor, this tool does not replace one.",
        "Work on the detector only when it is battery powered; a USB connection ties the detector ground to the PC's protective earth (use a battery-powered laptop or a USB isolator in the field).",
    };
}
