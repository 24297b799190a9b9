using System.Globalization;
using System.Text;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>Writes the per-gate budget tables (markdown) for one build of the device assembly.</summary>
internal static class BudgetReport
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>
    /// The generated block: the cases with their counts, times and rates at the low and high operation
    /// rates, what a board sustains at the default gate and display rates, the per-method table and
    /// the calls out of the device assembly. Problems found on the way are in counter.Problems.
    /// </summary>
    public static string Generate(IlCostCounter counter, CostAssumptions a, string assemblyLabel)
    {
        var sb = new StringBuilder();
        string low = Rate(a.LowOpsPerSecond);
        string high = Rate(a.HighOpsPerSecond);
        sb.Append("Counted from `").Append(assemblyLabel).Append("`. A call into mscorlib counts ").Append(a.MscorlibCallOps.ToString(Inv))
          .Append(" operations, a port call ").Append(a.PortCallOps.ToString(Inv)).Append("; nanoCLR is taken to run from ").Append(low).Append(" to ").Append(high)
          .Append(" (simple IL operations a second). **Estimate until a board measures it.**\n\n");

        sb.Append("| # | case | IL ops, defaults | time at ").Append(low).Append(" | time at ").Append(high).Append(" | per second at ").Append(low).Append(" | per second at ").Append(high)
          .Append(" | IL ops, settings at their limits | time at ").Append(low).Append(", limits |\n");
        sb.Append("|---|---|---:|---:|---:|---:|---:|---:|---:|\n");
        var defaults = new List<IlCost>();
        for (int i = 0; i < DeviceBudget.Rows.Count; i++)
        {
            BudgetRow row = DeviceBudget.Rows[i];
            IlCost d = Count(counter, row, CostProfile.Defaults);
            IlCost l = Count(counter, row, CostProfile.Limits);
            defaults.Add(d);
            sb.Append("| ").Append(i + 1).Append(" | ").Append(row.Label).Append(" | ").Append(Ops(d)).Append(" | ")
              .Append(Time(d, a.LowOpsPerSecond)).Append(" | ").Append(Time(d, a.HighOpsPerSecond)).Append(" | ")
              .Append(PerSecond(d, a.LowOpsPerSecond, row.Per)).Append(" | ").Append(PerSecond(d, a.HighOpsPerSecond, row.Per)).Append(" | ")
              .Append(Ops(l)).Append(" | ").Append(Time(l, a.LowOpsPerSecond)).Append(" |\n");
        }

        sb.Append('\n');
        long edgeRead = defaults[0].Ops;
        long snapshotRead = defaults[2].Ops;
        long gate = defaults[3].Ops;
        long refresh = defaults[5].Ops;
        double g = DeviceBudget.DefaultGatesPerSecond;
        double r = DeviceBudget.DefaultRefreshesPerSecond;
        sb.Append("Reads a second a board sustains with settings at their defaults (").Append(g.ToString(Inv)).Append(" gates/s from the 0.1 s gate, ").Append(r.ToString(Inv))
          .Append(" display refreshes/s from the 0.5 s display interval):\n\n");
        sb.Append("- edge input, one read = one edge (case 1, which counts a gate close with every edge): (operations a second - gates/s x case 4 - refreshes/s x case 6) / case 1: ");
        sb.Append(Sustained(a.LowOpsPerSecond, g, gate, r, refresh, edgeRead)).Append(" at ").Append(low).Append(", ");
        sb.Append(Sustained(a.HighOpsPerSecond, g, gate, r, refresh, edgeRead)).Append(" at ").Append(high).Append(".\n");

        // Snapshot input with link = capture: the gate close (case 3 - case 10) once per gate, a batch (case 7) per 64
        // reads, a status frame (case 8) a second and a header (case 9) every 5 s.
        long ordinary = defaults[9].Ops;
        long close = Math.Max(0, snapshotRead - ordinary);
        long batch = defaults[6].Ops;
        double fixedPerSecond = (g * (gate + close)) + (r * refresh) + defaults[7].Ops + (defaults[8].Ops / 5.0);
        double perRead = ordinary + (batch / 64.0);
        sb.Append("- snapshot input with link = capture: (operations a second - gates/s x (case 4 + the gate close, case 3 - case 10) - refreshes/s x case 6 - case 8 - case 9 / 5) / (case 10 + case 7 / 64): ");
        foreach ((double ops, string label, string end) in new[] { (a.LowOpsPerSecond, low, ", "), (a.HighOpsPerSecond, high, ".\n") })
        {
            double left = ops - fixedPerSecond;
            sb.Append(left <= 0 ? "none (the gates and the link alone need more)" : (left / perRead).ToString("N0", Inv) + " reads a second").Append(" at ").Append(label).Append(end);
        }

        sb.Append("- the board's own additions are not in these two lines: add case 11 to every step (read) and case 12 to every gate (")
          .Append(Ops(defaults[10])).Append(" and ").Append(Ops(defaults[11])).Append(" IL ops).\n");
        sb.Append("- the gate that completes a baseline capture (case 5) holds up the loop for ").Append(Time(defaults[4], a.HighOpsPerSecond)).Append(" to ")
          .Append(Time(defaults[4], a.LowOpsPerSecond)).Append(" (no_signal_s default 0.5 s, gate 0.1 s).\n\n");

        sb.Append("Per method (every device method reached from `DeviceLoop.Step`, the link's rare work and the board's additions of cases 11 and 12; worst case including what it calls):\n\n");
        sb.Append("| method | IL instructions | loops: bound | IL ops, defaults | IL ops, limits |\n");
        sb.Append("|---|---:|---|---:|---:|\n");
        counter.Count(DeviceBudget.Entries, CostProfile.Defaults, DeviceBudget.NeverCounted);
        int accessors = 0;
        foreach (MethodShape shape in counter.Reached.Values.ToList())
        {
            IlCost d = counter.Count([shape.Name], CostProfile.Defaults, DeviceBudget.NeverCounted);
            IlCost l = counter.Count([shape.Name], CostProfile.Limits, DeviceBudget.NeverCounted);
            bool plainAccessor = (shape.Name.Contains(".get_", StringComparison.Ordinal) || shape.Name.Contains(".set_", StringComparison.Ordinal))
                && shape.Loops.Count == 0 && d.Ops == shape.Instructions.Count && l.Ops == d.Ops;
            if (plainAccessor)
            {
                accessors++;
                continue;
            }

            string loops = shape.Loops.Count == 0
                ? "none"
                : string.Join("; ", shape.Loops.Select(loop => "#" + loop.Index + ": " + (counter.DeclaredBound(shape.Name + "#" + loop.Index)?.Expression ?? "UNDECLARED")));
            sb.Append("| ").Append(shape.Name).Append(" | ").Append(shape.Instructions.Count.ToString("N0", Inv)).Append(" | ").Append(loops.Replace("|", "\\|"))
              .Append(" | ").Append(Ops(d)).Append(" | ").Append(Ops(l)).Append(" |\n");
        }

        sb.Append("\n").Append(accessors.ToString(Inv)).Append(" property accessors that call nothing and loop nowhere are left out of this table (their count is their size).\n");
        sb.Append("\nCalls out of the device assembly on these paths (times made in each case above, settings at their defaults):\n\n");
        sb.Append("| call | counted as | made in case: times |\n");
        sb.Append("|---|---:|---|\n");
        var calls = new SortedDictionary<string, (string Kind, List<string> Rows)>(StringComparer.Ordinal);
        for (int i = 0; i < defaults.Count; i++)
        {
            foreach ((SortedDictionary<string, long> set, string kind) in new[] { (defaults[i].MscorlibCalls, "mscorlib"), (defaults[i].PortCalls, "port") })
            {
                foreach (KeyValuePair<string, long> c in set)
                {
                    if (!calls.TryGetValue(c.Key, out var entry))
                    {
                        entry = (kind, new List<string>());
                        calls[c.Key] = entry;
                    }

                    entry.Rows.Add((i + 1).ToString(Inv) + ": " + c.Value.ToString("N0", Inv));
                }
            }
        }

        foreach (KeyValuePair<string, (string Kind, List<string> Rows)> c in calls)
        {
            long ops = c.Value.Kind == "port" ? a.PortCallOps : a.MscorlibCallOps;
            sb.Append("| `").Append(c.Key).Append("` | ").Append(ops.ToString(Inv)).Append(" (").Append(c.Value.Kind).Append(") | ").Append(string.Join(", ", c.Value.Rows)).Append(" |\n");
        }

        return sb.ToString();
    }

    /// <summary>One row's count under a profile.</summary>
    public static IlCost Count(IlCostCounter counter, BudgetRow row, CostProfile profile)
    {
        return counter.Count(row.Entries, profile, row.Excluded, row.Overrides, row.OnePassOf);
    }

    private static string Ops(IlCost c) => c.UnboundedBy != null ? "no limit (" + c.UnboundedBy + ")" : c.Ops.ToString("N0", Inv);

    private static string Time(IlCost c, double opsPerSecond) => c.UnboundedBy != null ? "no limit" : Seconds(c.Ops / opsPerSecond);

    private static string PerSecond(IlCost c, double opsPerSecond, string per)
    {
        return c.UnboundedBy != null || c.Ops == 0 ? "-" : Significant(opsPerSecond / c.Ops) + " " + per;
    }

    private static string Sustained(double opsPerSecond, double gates, long gateOps, double refreshes, long refreshOps, long readOps)
    {
        double left = opsPerSecond - (gates * gateOps) - (refreshes * refreshOps);
        return left <= 0 ? "none (the gates and refreshes alone need more)" : Significant(left / readOps) + " reads/s";
    }

    private static string Rate(double opsPerSecond) => Significant(opsPerSecond / 1e6) + " M op/s";

    private static string Seconds(double s)
    {
        if (s >= 1)
        {
            return Significant(s) + " s";
        }

        return s >= 1e-3 ? Significant(s * 1e3) + " ms" : Significant(s * 1e6) + " us";
    }

    // Three significant figures, no exponent.
    private static string Significant(double x)
    {
        if (x == 0)
        {
            return "0";
        }

        int digits = Math.Max(0, 2 - (int)Math.Floor(Math.Log10(Math.Abs(x))));
        return Math.Round(x, digits).ToString("#,0." + new string('#', digits), Inv).TrimEnd('.');
    }
}
