using FreqReadout.Detection;
using FreqReadout.Numerics;

namespace FreqReadout.Readout
{
    /// <summary>
    /// Holds a finished pass (an event ended <see cref="EventEnd.Released"/> or <see cref="EventEnd.Resolved"/>) for
    /// <see cref="GapSeconds"/> + 1 s before it is queued (the resolver may report a pass up to 1 s before the candidate
    /// that led to it opened), so that a pass whose shift dipped under the release level for a moment is reported once:
    /// an event of the same sign that starts no later than the gap after the held one ended is merged into it (start of
    /// the first, end of the second, the larger peak, one with a class before one without, with its class, sigma and
    /// noise; below-floor and mixed-sign flags of either). Any other event, or one of the other sign, first queues the held
    /// one, so the queue keeps time order. Nothing allocates; O(1) per gate.
    /// </summary>
    internal sealed class EventMerger
    {
        /// <summary>Events of one sign closer than this are one event, s (common practice, no source).</summary>
        public const double GapSeconds = 0.5;

        // How long a finished pass is held, s: the gap, plus the time by which a pass the resolver finds afterwards may start
        // before the candidate that led to it (ExcursionResolver.EdgeMarginSeconds): a pass's own tail, decided later, still
        // merges into it.
        private const double HoldSeconds = GapSeconds + ExcursionResolver.EdgeMarginSeconds;

        private const double TimeEpsilonSeconds = 1e-6;

        private readonly DetectionEventQueue queue;
        private readonly DetectionEvent held = new DetectionEvent();
        private readonly DetectionEvent fresh = new DetectionEvent();
        private bool hasHeld;

        /// <summary>Merges into, and queues to, the given queue.</summary>
        public EventMerger(DetectionEventQueue queue)
        {
            this.queue = queue;
        }

        /// <summary>The object to fill with a finished event before <see cref="Commit"/>.</summary>
        public DetectionEvent NextSlot()
        {
            return fresh;
        }

        /// <summary>Takes the event filled into <see cref="NextSlot"/>: merged into the held pass, held, or queued.</summary>
        public void Commit()
        {
            bool pass = fresh.End == EventEnd.Released || fresh.End == EventEnd.Resolved;
            if (hasHeld)
            {
                bool sameSign = (fresh.PeakShiftHz > 0) == (held.PeakShiftHz > 0);
                if (pass && sameSign && fresh.StartSeconds - held.EndSeconds <= GapSeconds + TimeEpsilonSeconds)
                {
                    Merge();
                    return;
                }

                Flush();
            }

            if (pass)
            {
                held.CopyFrom(fresh);
                hasHeld = true;
                return;
            }

            queue.NextSlot().CopyFrom(fresh);
            queue.Commit();
        }

        /// <summary>
        /// Once per gate: queues the held pass when the gap after it has passed at time t and no candidate that could
        /// continue it is open (a candidate open since candidateStartSeconds, when candidateOpen).
        /// </summary>
        public void Tick(double timeSeconds, bool candidateOpen, double candidateStartSeconds)
        {
            if (!hasHeld || timeSeconds - held.EndSeconds <= HoldSeconds)
            {
                return;
            }

            if (!candidateOpen || candidateStartSeconds - held.EndSeconds > HoldSeconds + TimeEpsilonSeconds)
            {
                Flush();
            }
        }

        /// <summary>Queues the held pass now (end of a run, or before another event).</summary>
        public void Flush()
        {
            if (!hasHeld)
            {
                return;
            }

            queue.NextSlot().CopyFrom(held);
            queue.Commit();
            hasHeld = false;
        }

        private void Merge()
        {
            // A peak with a class (ferrous or non-ferrous) wins over one without, then the larger one.
            bool freshClear = fresh.Class == TargetClass.Ferrous || fresh.Class == TargetClass.NonFerrous;
            bool heldClear = held.Class == TargetClass.Ferrous || held.Class == TargetClass.NonFerrous;
            bool later = freshClear != heldClear ? freshClear : ScalarMath.Abs(fresh.PeakShiftHz) > ScalarMath.Abs(held.PeakShiftHz);
            DetectionEvent peak = later ? fresh : held;
            double end = fresh.EndSeconds > held.EndSeconds ? fresh.EndSeconds : held.EndSeconds;
            held.Set(
                held.StartSeconds,
                end,
                peak.PeakSeconds,
                peak.PeakShiftHz,
                peak.HasPpm,
                peak.PeakShiftPpm,
                peak.PeakSigma,
                peak.NoiseHz,
                peak.Class,
                held.BelowBeatFloor || fresh.BelowBeatFloor,
                held.MixedSign || fresh.MixedSign,
                fresh.End);
        }
    }
}
