using FreqReadout.Counting;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Bench;

/// <summary>
/// The plain ways' gates, computed straight from a capture's rows (not through the project's counters, so the reference
/// stays fixed while the counting core changes): a gate opens on a row and closes on the first row whose unwrapped tick is
/// at least <c>gate_s x clock_hz</c> later; the closing row opens the next gate. Edges: f = n x prescale x clock_hz /
/// (tick_close - tick_open) for n recorded intervals; snapshots: f = (count_close - count_open) x clock_hz /
/// (tick_close - tick_open). Gate times are seconds from the first row. Rows whose tick (or count) step the
/// <see cref="TimerUnwrapper"/> rejects are skipped.
/// </summary>
public static class PlainReciprocalGates
{
    /// <summary>The plain ways' gate length, s.</summary>
    public const double GateSeconds = 0.1;

    /// <summary>Reciprocal gates of <paramref name="capture"/> (empty when it holds fewer than one whole gate).</summary>
    public static List<PlainGate> Compute(MemoryCapture capture, double gateSeconds = GateSeconds)
    {
        CaptureMetadata md = capture.Metadata;
        bool snapshots = md.Kind == CaptureKind.Snapshots;
        var ticks = new TimerUnwrapper(md.TimerBits);
        var counts = new TimerUnwrapper(md.CountBits, true);
        long gateTicks = (long)Math.Ceiling(gateSeconds * md.ClockHz);
        double clock = md.ClockHz;
        int prescale = snapshots ? 1 : md.Prescale;
        var gates = new List<PlainGate>();
        bool open = false;
        long openTick = 0;
        long openCount = 0;
        long openIndex = 0;
        long accepted = 0;
        for (long i = 0; i < capture.Rows; i++)
        {
            if (!ticks.TryUnwrap(capture.TickAt(i), out long tick))
            {
                continue;
            }

            long count = 0;
            if (snapshots && !counts.TryUnwrap(capture.CountAt(i), out count))
            {
                continue;
            }

            if (!open)
            {
                open = true;
                openTick = tick;
                openCount = count;
                openIndex = accepted;
            }
            else if (tick - openTick >= gateTicks)
            {
                double span = tick - openTick;
                double cycles = snapshots ? count - openCount : (double)(accepted - openIndex) * prescale;
                gates.Add(new PlainGate(tick / clock, cycles * clock / span));
                openTick = tick;
                openCount = count;
                openIndex = accepted;
            }

            accepted++;
        }

        return gates;
    }
}
