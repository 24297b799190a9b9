using System.Diagnostics;

namespace FreqReadout.Tests.Robustness;

/// <summary>
/// The mutation fuzz loop: a fixed base seed, one <see cref="Random"/> per input (seed derived from
/// the base seed and the input's index, so one input reruns alone), one to three named operators per
/// input, each parse checked to end in a result or the documented error. The loop runs on its own
/// thread; the calling thread watches it and stops waiting when one input runs past the hang bound.
/// </summary>
public sealed class FuzzRunner
{
    /// <summary>One input running longer than this is a hang (a guard, not a performance check).</summary>
    public static readonly TimeSpan HangBound = TimeSpan.FromSeconds(2);

    private readonly ParserTarget _target;

    public FuzzRunner(ParserTarget target)
    {
        _target = target;
    }

    /// <summary>Inputs that ended in a result.</summary>
    public int Results { get; private set; }

    /// <summary>Inputs that ended in the documented format error.</summary>
    public int DocumentedErrors { get; private set; }

    /// <summary>Applications of each operator.</summary>
    public Dictionary<MutationOperator, int> OperatorCounts { get; } = Mutator.All.ToDictionary(o => o, _ => 0);

    /// <summary>Failures met (at most <see cref="MaxFailures"/> kept).</summary>
    public List<FuzzFailure> Failures { get; } = new();

    /// <summary>Failures kept before the loop stops.</summary>
    public int MaxFailures { get; init; } = 20;

    /// <summary>The seed of input <paramref name="index"/>'s own Random.</summary>
    public static int InputSeed(int baseSeed, int index) => unchecked((baseSeed * 1_000_003) + index);

    /// <summary>Builds input <paramref name="inputSeed"/>: picks seeds and operators from its own Random.</summary>
    public byte[] Build(int inputSeed, out string operators)
    {
        var rng = new Random(inputSeed);
        var seeds = _target.Seeds;
        byte[] input = seeds[rng.Next(seeds.Count)];
        int steps = rng.Next(4) == 0 ? rng.Next(2, 4) : 1;
        var names = new List<string>();
        for (int s = 0; s < steps; s++)
        {
            var op = Mutator.All[rng.Next(Mutator.All.Length)];
            byte[] other = seeds[rng.Next(seeds.Count)];
            byte[]? framed = _target.BlockAware && rng.Next(4) != 0 ? BinaryBlocks.MutateBlock(op, input, other, rng) : null;
            input = framed ?? Mutator.Apply(op, input, other, rng);
            OperatorCounts[op]++;
            names.Add(framed != null ? "Block" + op : op.ToString());
        }

        operators = string.Join("+", names);
        return input;
    }

    /// <summary>Parses one input: null when it ended in a result or the documented error, else what went wrong.</summary>
    public string? Check(byte[] input)
    {
        try
        {
            _target.Parse(input);
            Results++;
            return null;
        }
        catch (Exception ex) when (ex.GetType() == _target.DocumentedError)
        {
            if (string.IsNullOrWhiteSpace(ex.Message) || ex.Message.Length > 4000)
            {
                return $"{ex.GetType().Name} with an unusable message ({ex.Message.Length} characters)";
            }

            DocumentedErrors++;
            return null;
        }
        catch (Exception ex)
        {
            return $"{ex.GetType().FullName}: {ex.Message} at {ex.StackTrace?.Split('\n').FirstOrDefault()?.Trim()}";
        }
    }

    /// <summary>Runs <paramref name="count"/> mutated inputs; returns when done, after <see cref="MaxFailures"/> failures, or at a hang.</summary>
    public void Run(int baseSeed, int count)
    {
        long inputStarted = 0;
        int current = -1;
        string currentOps = string.Empty;
        byte[] currentInput = Array.Empty<byte>();
        bool done = false;
        bool abandoned = false;
        Exception? loopError = null;
        var clock = Stopwatch.StartNew();

        var thread = new Thread(() =>
        {
            try
            {
                for (int i = 0; i < count && Failures.Count < MaxFailures; i++)
                {
                    lock (this)
                    {
                        if (abandoned)
                        {
                            return;
                        }
                    }

                    int seed = InputSeed(baseSeed, i);
                    byte[] input = Build(seed, out string ops);
                    lock (this)
                    {
                        current = seed;
                        currentOps = ops;
                        currentInput = input;
                        inputStarted = clock.ElapsedTicks;
                    }

                    long t0 = Stopwatch.GetTimestamp();
                    string? problem = Check(input);
                    var took = Stopwatch.GetElapsedTime(t0);
                    if (problem == null && took > HangBound)
                    {
                        problem = $"took {took.TotalSeconds:F1} s (bound {HangBound.TotalSeconds} s)";
                    }

                    if (problem != null)
                    {
                        lock (this)
                        {
                            if (abandoned)
                            {
                                return;
                            }

                            Failures.Add(new FuzzFailure(ops, seed, input, problem));
                        }
                    }
                }
            }
            catch (Exception ex)
            {
                loopError = ex;
            }
            finally
            {
                lock (this)
                {
                    done = true;
                }
            }
        })
        { IsBackground = true, Name = "fuzz " + _target.Name };
        thread.Start();

        while (!thread.Join(100))
        {
            lock (this)
            {
                if (!done && current >= 0 && Stopwatch.GetElapsedTime(0, clock.ElapsedTicks - inputStarted) > HangBound * 2)
                {
                    // Still inside one input: report it as a hang and leave the (background) thread behind.
                    Failures.Add(new FuzzFailure(currentOps, current, currentInput, $"still running after {HangBound.TotalSeconds * 2} s: a hang"));
                    abandoned = true;
                    return;
                }
            }
        }

        if (loopError != null)
        {
            throw new InvalidOperationException("the fuzz loop itself failed", loopError);
        }
    }

    /// <summary>
    /// Shrinks a failing input a little: removes chunks (halves down to single bytes) while the input
    /// still fails the same way (same exception type), at most <paramref name="attempts"/> parses.
    /// </summary>
    public byte[] Minimise(byte[] input, string problem, int attempts = 400)
    {
        string kind = problem.Split(':')[0];
        byte[] best = input;
        for (int chunk = Math.Max(1, best.Length / 2); chunk >= 1 && attempts > 0; chunk /= 2)
        {
            for (int at = 0; at + chunk <= best.Length && attempts > 0;)
            {
                byte[] trial = new byte[best.Length - chunk];
                Array.Copy(best, 0, trial, 0, at);
                Array.Copy(best, at + chunk, trial, at, best.Length - at - chunk);
                attempts--;
                string? p = Check(trial);
                if (p != null && p.Split(':')[0] == kind && !p.StartsWith("took", StringComparison.Ordinal))
                {
                    best = trial;
                }
                else
                {
                    at += chunk;
                }
            }
        }

        return best;
    }
}
