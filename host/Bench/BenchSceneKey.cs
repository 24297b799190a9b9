namespace FreqReadout.Host.Bench;

/// <summary>Which bench scene: kind, mode, with targets or drift-only, its number in its group, and its seeds.</summary>
/// <param name="Kind">Drift kind.</param>
/// <param name="Mode">What is counted.</param>
/// <param name="DriftOnly">True for a drift-only scene (no targets), false for a scene with targets.</param>
/// <param name="Index">Number of the scene within its kind, mode and role, from 0.</param>
/// <param name="Seed">The scene's own seed (draws and simulation).</param>
/// <param name="GroupSeed">The seed shared by the scenes of one kind, mode and role (it deals the target classes so that exactly half are ferrous).</param>
public sealed record BenchSceneKey(BenchKind Kind, BenchMode Mode, bool DriftOnly, int Index, long Seed, long GroupSeed)
{
    /// <summary>A name such as <c>settling/beat-below/targets-2</c>.</summary>
    public string Name => $"{BenchNames.Of(Kind)}/{BenchNames.Of(Mode)}/{(DriftOnly ? "drift" : "targets")}-{Index}";

    /// <summary>
    /// The keys of a whole bench for a master seed and size, in a fixed order (kind, mode, targets then drift-only, index).
    /// Seeds: SplitMix64 of the master seed, then mixed with the kind, mode, role and index (each XOR-ed in and SplitMix64-ed).
    /// </summary>
    public static List<BenchSceneKey> All(long masterSeed, QualityBenchSize size, IReadOnlyCollection<BenchKind> kinds)
    {
        var keys = new List<BenchSceneKey>();
        foreach (BenchKind kind in Enum.GetValues<BenchKind>())
        {
            if (!kinds.Contains(kind))
            {
                continue;
            }

            foreach (BenchMode mode in Enum.GetValues<BenchMode>())
            {
                for (int role = 0; role < 2; role++)
                {
                    bool driftOnly = role == 1;
                    int count = driftOnly ? size.DriftScenesPerMode : size.TargetScenesPerMode;
                    long group = Mix(masterSeed, (int)kind, (int)mode, role, -1);
                    for (int i = 0; i < count; i++)
                    {
                        keys.Add(new BenchSceneKey(kind, mode, driftOnly, i, Mix(masterSeed, (int)kind, (int)mode, role, i), group));
                    }
                }
            }
        }

        return keys;
    }

    private static long Mix(long master, int kind, int mode, int role, int index)
    {
        // The master is scrambled first: XOR-ing small parts into a small master seed directly made different (master, kind)
        // pairs give one scene seed (master 4 with kind 1 and master 5 with kind 2, for instance).
        ulong x = SplitMix(unchecked((ulong)master));
        foreach (int part in new[] { kind, mode, role, index })
        {
            x = SplitMix(x ^ unchecked((ulong)(part + 0x51ED27)));
        }

        return (long)(x >> 1);
    }

    private static ulong SplitMix(ulong x)
    {
        ulong z = unchecked(x + 0x9E3779B97F4A7C15UL);
        z = unchecked((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL);
        z = unchecked((z ^ (z >> 27)) * 0x94D049BB133111EBUL);
        return z ^ (z >> 31);
    }
}
