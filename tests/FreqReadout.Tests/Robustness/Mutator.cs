using System.Text;

namespace FreqReadout.Tests.Robustness;

/// <summary>
/// Applies the named mutation operators to seed inputs. Deterministic: the same seeds, operator and
/// <see cref="Random"/> state give the same bytes, so a failure reproduces from its input seed.
/// </summary>
public static class Mutator
{
    /// <summary>Every operator, in the order the fuzz loop cycles through them.</summary>
    public static readonly MutationOperator[] All = Enum.GetValues<MutationOperator>();

    private static readonly byte[] Structural = Encoding.ASCII.GetBytes(",\n\r#=:{}[]\"-.e0 \t\\");

    private static readonly string[] Boundaries =
    {
        "0", "-1", "-0", "1", "9223372036854775807", "9223372036854775808", "-9223372036854775808",
        "18446744073709551615", "18446744073709551616", "4294967296", "16777216", "65536", "1e308",
        "-1e308", "1e309", "4.9e-324", "NaN", "Infinity", "-Infinity", "0x10", "1.5", "1e",
        new string('9', 400), "0." + new string('0', 300) + "1", "00000000000000000000001",
    };

    /// <summary>Mutates <paramref name="input"/> with <paramref name="op"/>; <paramref name="other"/> is the second input of a splice.</summary>
    public static byte[] Apply(MutationOperator op, byte[] input, byte[] other, Random rng)
    {
        var b = new List<byte>(input);
        switch (op)
        {
            case MutationOperator.BitFlip:
                if (b.Count == 0)
                {
                    break;
                }

                for (int i = rng.Next(1, 9); i > 0; i--)
                {
                    int at = rng.Next(b.Count);
                    b[at] ^= (byte)(1 << rng.Next(8));
                }

                break;

            case MutationOperator.ByteInsertion:
            {
                int at = rng.Next(b.Count + 1);
                int n = rng.Next(1, 17);
                var add = new byte[n];
                for (int i = 0; i < n; i++)
                {
                    add[i] = rng.Next(2) == 0 ? (byte)rng.Next(256) : Structural[rng.Next(Structural.Length)];
                }

                b.InsertRange(at, add);
                break;
            }

            case MutationOperator.ByteDeletion:
                if (b.Count > 0)
                {
                    int at = rng.Next(b.Count);
                    b.RemoveRange(at, Math.Min(rng.Next(1, 17), b.Count - at));
                }

                break;

            case MutationOperator.ChunkDuplication:
                if (b.Count > 0)
                {
                    int from = rng.Next(b.Count);
                    int n = Math.Min(rng.Next(1, 257), b.Count - from);
                    var chunk = b.GetRange(from, n);
                    int copies = rng.Next(1, 4);
                    int to = rng.Next(b.Count + 1);
                    for (int i = 0; i < copies; i++)
                    {
                        b.InsertRange(to, chunk);
                    }
                }

                break;

            case MutationOperator.Truncation:
                b = b.GetRange(0, b.Count == 0 ? 0 : rng.Next(b.Count));
                break;

            case MutationOperator.BoundaryNumber:
                ReplaceDigitRun(b, rng);
                break;

            case MutationOperator.Splice:
            {
                int cutA = rng.Next(b.Count + 1);
                int cutB = rng.Next(other.Length + 1);
                b = b.GetRange(0, cutA);
                b.AddRange(other.AsSpan(cutB).ToArray());
                break;
            }
        }

        return b.ToArray();
    }

    /// <summary>Replaces a random run of ASCII digits (or, in binary input, 8 bytes) with a boundary value.</summary>
    private static void ReplaceDigitRun(List<byte> b, Random rng)
    {
        var runs = new List<(int Start, int Length)>();
        for (int i = 0; i < b.Count;)
        {
            if (b[i] >= '0' && b[i] <= '9')
            {
                int start = i;
                while (i < b.Count && b[i] >= '0' && b[i] <= '9')
                {
                    i++;
                }

                runs.Add((start, i - start));
            }
            else
            {
                i++;
            }
        }

        if (runs.Count == 0 || rng.Next(4) == 0)
        {
            // Also boundary integers as raw little-endian fields, for the binary format's counts and lengths.
            if (b.Count >= 8)
            {
                ulong[] raw = { 0, ulong.MaxValue, 1UL << 63, (1UL << 63) - 1, uint.MaxValue, 1UL << 32, 0x7FF8_0000_0000_0000 };
                int at = rng.Next(b.Count - 7);
                int width = new[] { 1, 2, 4, 8 }[rng.Next(4)];
                ulong v = raw[rng.Next(raw.Length)];
                for (int i = 0; i < width; i++)
                {
                    b[at + i] = (byte)(v >> (8 * i));
                }
            }

            if (runs.Count == 0)
            {
                return;
            }
        }

        var (s, len) = runs[rng.Next(runs.Count)];
        b.RemoveRange(s, len);
        b.InsertRange(s, Encoding.ASCII.GetBytes(Boundaries[rng.Next(Boundaries.Length)]));
    }
}
