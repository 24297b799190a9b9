namespace FreqReadout.Host.Simulation;

/// <summary>The coil's timeline from <see cref="SceneSweep"/>: lead-in rest, passes, pauses, tail rest; or its explicit legs.</summary>
public sealed class SweepPlan
{
    private readonly SceneSweep _sweep;

    public SweepPlan(SceneSweep sweep)
    {
        _sweep = sweep;
        if (sweep.Legs is { Count: > 0 } legs)
        {
            var explicitPasses = new List<SweepPass>();
            for (int i = 0; i < legs.Count; i++)
            {
                var leg = legs[i];
                explicitPasses.Add(new SweepPass(i, leg.StartS, leg.StartS + leg.DurationS, leg.FromM, leg.ToM));
            }

            Passes = explicitPasses;
            PlannedDurationS = explicitPasses[^1].EndTimeS + sweep.TailS;
            return;
        }

        double passS = Math.Abs(sweep.EndM - sweep.StartM) / sweep.SpeedMPerS;
        var passes = new List<SweepPass>();
        double t = sweep.LeadInS;
        for (int i = 0; i < sweep.Passes; i++)
        {
            bool forward = !sweep.Alternate || i % 2 == 0;
            double from = forward ? sweep.StartM : sweep.EndM;
            double to = forward ? sweep.EndM : sweep.StartM;
            passes.Add(new SweepPass(i, t, t + passS, from, to));
            t += passS + (i + 1 < sweep.Passes ? sweep.PauseS : 0.0);
        }

        Passes = passes;
        PlannedDurationS = t + sweep.TailS;
    }

    /// <summary>The passes in time order.</summary>
    public IReadOnlyList<SweepPass> Passes { get; }

    /// <summary>Lead-in + passes + pauses + tail, s.</summary>
    public double PlannedDurationS { get; }

    /// <summary>Height of the coil plane above the surface, m.</summary>
    public double HeightM => _sweep.HeightM;

    /// <summary>
    /// Coil position along the line at time t, m; false when the coil is lifted clear (pauses between non-alternating passes).
    /// Before the first pass it rests at the first pass's start, after the last at its end.
    /// </summary>
    public bool TryGetPosition(double timeS, out double positionM)
    {
        var first = Passes[0];
        if (timeS <= first.StartTimeS)
        {
            positionM = first.FromM;
            return true;
        }

        for (int i = 0; i < Passes.Count; i++)
        {
            var p = Passes[i];
            if (timeS <= p.EndTimeS)
            {
                if (timeS >= p.StartTimeS)
                {
                    positionM = p.PositionAt(timeS);
                    return true;
                }

                // In the pause before pass i.
                var previous = Passes[i - 1];
                positionM = previous.ToM;
                return previous.ToM == p.FromM;
            }
        }

        positionM = Passes[Passes.Count - 1].ToM;
        return true;
    }
}
