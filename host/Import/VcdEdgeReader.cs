using System.Globalization;
using System.Numerics;

namespace FreqReadout.Host.Import;

/// <summary>
/// Reads the rising edges of one signal from a value change dump (IEEE Std 1364-2005, clause 18, "Value change dump
/// (VCD) files"; from memory): the header's <c>$timescale</c>, nested <c>$scope</c>/<c>$upscope</c>, <c>$var</c>
/// declarations (scalars, and vectors with a bit select), then <c>#time</c> stamps and value changes: <c>0!</c>,
/// <c>1!</c>, <c>x!</c>, <c>z!</c> for scalars, <c>b1010 #</c> for vectors (left-extended as the standard says),
/// <c>r1.5 %</c> reals (ignored), also inside <c>$dumpvars</c> and the other dump blocks. A rising edge is a change of
/// the chosen bit from 0 to 1; x or z in between break an edge (0, x, 1 is not one). Two passes over the file: the first
/// finds the signal and the greatest common divisor of all time stamps after the first (the analyser's real sample
/// period, not the timescale), the second streams the edges out. Every error names the file, the line and what was
/// expected.
/// </summary>
public sealed class VcdEdgeReader
{
    private readonly string _path;

    private VcdEdgeReader(string path, VcdVariable variable, int bit, BigInteger timescaleFs, long periodUnits, long firstTime)
    {
        _path = path;
        Variable = variable;
        Bit = bit;
        TimescaleFemtoseconds = timescaleFs;
        PeriodUnits = periodUnits;
        FirstTime = firstTime;
    }

    /// <summary>The signal read.</summary>
    public VcdVariable Variable { get; }

    /// <summary>The bit of it read (its index as declared).</summary>
    public int Bit { get; }

    /// <summary>The timescale, femtoseconds per time unit.</summary>
    public BigInteger TimescaleFemtoseconds { get; }

    /// <summary>The greatest common divisor of the time stamps (relative to the first), in time units: one tick of the capture.</summary>
    public long PeriodUnits { get; }

    /// <summary>The first time stamp, in time units.</summary>
    public long FirstTime { get; }

    /// <summary>The capture's clock: one over (period x timescale), Hz.</summary>
    public double ClockHz => 1e15 / ((double)TimescaleFemtoseconds * PeriodUnits);

    /// <summary>Opens a dump and finds the signal <paramref name="signal"/> (full or short name, optionally with a bit select <c>name[3]</c>).</summary>
    /// <exception cref="VcdFormatException">The file is not a dump this reader reads, or the signal is missing, ambiguous or not a bit.</exception>
    public static VcdEdgeReader Open(string path, string signal)
    {
        string name = signal;
        int? bitSelect = null;
        int open = signal.LastIndexOf('[');
        if (open > 0 && signal.EndsWith(']'))
        {
            if (!int.TryParse(signal[(open + 1)..^1], NumberStyles.None, CultureInfo.InvariantCulture, out int b))
            {
                throw new VcdFormatException($"--signal {signal}: a bit select must be a whole number in brackets, e.g. data[3]");
            }

            name = signal[..open];
            bitSelect = b;
        }

        var variables = new List<VcdVariable>();
        var scopes = new List<string>();
        BigInteger? timescale = null;
        bool definitionsEnded = false;
        string? pendingCommand = null;
        List<string>? pendingWords = null;
        bool inComment = false;
        bool expectId = false;
        long? first = null;
        long gcd = 0;
        long lineNumber = 0;
        foreach (string line in File.ReadLines(path))
        {
            lineNumber++;
            string text = line.Trim();
            if (text.Length == 0)
            {
                continue;
            }

            if (!definitionsEnded)
            {
                // Header commands, one or more per line, or spread over lines ($timescale\n 1 ns\n $end).
                HeaderLine(text, path, lineNumber, scopes, variables, ref timescale, ref definitionsEnded, ref pendingCommand, ref pendingWords);
                continue;
            }

            foreach (string token in text.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries))
            {
                if (SkipComment(token, ref inComment))
                {
                    continue;
                }

                if (expectId)
                {
                    expectId = false;    // the identifier after a vector or real value: it may begin with '#'
                    continue;
                }

                if (token[0] is 'b' or 'B' or 'r' or 'R')
                {
                    expectId = true;
                    continue;
                }

                if (token[0] == '#')
                {
                    if (!long.TryParse(token.AsSpan(1), NumberStyles.None, CultureInfo.InvariantCulture, out long t))
                    {
                        throw new VcdFormatException($"{path}:{lineNumber}: a time stamp must be # and a whole number, got {Commands.OptionValues.Quote(token)}");
                    }

                    if (first == null)
                    {
                        first = t;
                    }
                    else
                    {
                        if (t < first.Value)
                        {
                            throw new VcdFormatException($"{path}:{lineNumber}: time #{t} is before the first time stamp #{first}");
                        }

                        gcd = (long)BigInteger.GreatestCommonDivisor(gcd, t - first.Value);
                    }
                }
            }
        }

        if (pendingCommand != null || !definitionsEnded)
        {
            throw new VcdFormatException($"{path}: not a value change dump this reader reads: no $enddefinitions $end (expected a header of $timescale, $scope, $var ... then $enddefinitions $end)");
        }

        if (timescale == null)
        {
            throw new VcdFormatException($"{path}: the header has no $timescale (e.g. $timescale 1 ns $end)");
        }

        var byFull = variables.Where(v => v.FullName == name).ToList();
        var matches = byFull.Count > 0 ? byFull : variables.Where(v => v.ShortName == name).ToList();
        if (matches.Count == 0)
        {
            string known = string.Join(", ", variables.Take(12).Select(v => v.FullName)) + (variables.Count > 12 ? ", ..." : string.Empty);
            throw new VcdFormatException($"{path}: no signal named {name}; the dump has: {known}");
        }

        if (matches.Select(v => v.Id).Distinct().Count() > 1)
        {
            throw new VcdFormatException($"{path}: the short name {name} is ambiguous: {string.Join(", ", matches.Select(v => v.FullName))}; give the full name");
        }

        VcdVariable variable = matches[0];
        int bit;
        if (bitSelect is int chosen)
        {
            if (chosen < Math.Min(variable.LowBit, variable.HighBit) || chosen > Math.Max(variable.LowBit, variable.HighBit))
            {
                throw new VcdFormatException($"{path}: {variable.FullName} has bits {variable.HighBit} to {variable.LowBit}; [{chosen}] is not one of them");
            }

            bit = chosen;
        }
        else if (variable.Width == 1)
        {
            bit = variable.LowBit;
        }
        else
        {
            throw new VcdFormatException($"{path}: {variable.FullName} is {variable.Width} bits wide; choose one with a bit select, e.g. {name}[{variable.LowBit}]");
        }

        if (first == null || gcd == 0)
        {
            throw new VcdFormatException($"{path}: fewer than two distinct time stamps: no sample period to time edges with");
        }

        return new VcdEdgeReader(path, variable, bit, timescale.Value, gcd, first.Value);
    }

    /// <summary>
    /// The ticks of the chosen bit's rising edges, in order: (time - first time stamp) / period, streamed from a second
    /// pass over the file.
    /// </summary>
    /// <exception cref="VcdFormatException">A value change that cannot be read (names the line).</exception>
    public IEnumerable<long> RisingEdgeTicks()
    {
        bool definitionsEnded = false;
        bool inComment = false;
        long time = 0;
        char previous = '?';
        string? vectorValue = null;
        long lineNumber = 0;
        int position = Math.Abs(Bit - Variable.LowBit);
        foreach (string line in File.ReadLines(_path))
        {
            lineNumber++;
            if (!definitionsEnded)
            {
                definitionsEnded = line.Contains("$enddefinitions", StringComparison.Ordinal);
                continue;
            }

            foreach (string token in line.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries))
            {
                if (SkipComment(token, ref inComment) || token[0] == '$')
                {
                    continue;
                }

                char value;
                if (vectorValue != null)
                {
                    // The identifier after a vector (or real) value.
                    string bits = vectorValue;
                    vectorValue = null;
                    if (token != Variable.Id || bits.Length == 0 || bits[0] == 'r')
                    {
                        continue;
                    }

                    value = BitOf(bits, position);
                }
                else if (token[0] == '#')
                {
                    time = long.Parse(token.AsSpan(1), NumberStyles.None, CultureInfo.InvariantCulture);
                    continue;
                }
                else if (token[0] is 'b' or 'B' or 'r' or 'R')
                {
                    vectorValue = token[0] is 'r' or 'R' ? "r" : token[1..].ToLowerInvariant();
                    continue;
                }
                else if (token[0] is '0' or '1' or 'x' or 'X' or 'z' or 'Z')
                {
                    if (token[1..] != Variable.Id)
                    {
                        continue;
                    }

                    value = char.ToLowerInvariant(token[0]);
                }
                else
                {
                    throw new VcdFormatException($"{_path}:{lineNumber}: expected a time stamp (#t) or a value change (0!, b1010 #, r1.5 %), got {Commands.OptionValues.Quote(token)}");
                }

                if (previous == '0' && value == '1')
                {
                    yield return (time - FirstTime) / PeriodUnits;
                }

                previous = value;
            }
        }
    }

    /// <summary>The bit at <paramref name="position"/> from the right of a vector value, left-extended as IEEE 1364 18.2.1 says (0 or 1 extend with 0; x with x; z with z).</summary>
    private static char BitOf(string bits, int position)
    {
        if (position < bits.Length)
        {
            return bits[bits.Length - 1 - position];
        }

        return bits[0] is 'x' or 'z' ? bits[0] : '0';
    }

    private static bool SkipComment(string token, ref bool inComment)
    {
        if (inComment)
        {
            inComment = token != "$end";
            return true;
        }

        if (token == "$comment")
        {
            inComment = true;
            return true;
        }

        return false;
    }

    private static void HeaderLine(string text, string path, long lineNumber, List<string> scopes, List<VcdVariable> variables, ref BigInteger? timescale, ref bool ended, ref string? command, ref List<string>? words)
    {
        foreach (string token in text.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries))
        {
            if (command == null)
            {
                if (token[0] != '$')
                {
                    throw new VcdFormatException($"{path}:{lineNumber}: expected a header command ($timescale, $scope, $var, $upscope, $enddefinitions...), got {Commands.OptionValues.Quote(token)}");
                }

                command = token;
                words = new List<string>();
                continue;
            }

            if (token != "$end")
            {
                words!.Add(token);
                continue;
            }

            switch (command)
            {
                case "$timescale":
                    timescale = Timescale(string.Concat(words!), path, lineNumber);
                    break;
                case "$scope":
                    if (words!.Count < 2)
                    {
                        throw new VcdFormatException($"{path}:{lineNumber}: $scope needs a type and a name ($scope module top $end)");
                    }

                    scopes.Add(words[1]);
                    break;
                case "$upscope":
                    if (scopes.Count == 0)
                    {
                        throw new VcdFormatException($"{path}:{lineNumber}: $upscope without an open $scope");
                    }

                    scopes.RemoveAt(scopes.Count - 1);
                    break;
                case "$var":
                    variables.Add(Declare(words!, scopes, path, lineNumber));
                    break;
                case "$enddefinitions":
                    ended = true;
                    break;
            }

            command = null;
            words = null;
            if (ended)
            {
                return;
            }
        }
    }

    private static VcdVariable Declare(List<string> words, List<string> scopes, string path, long lineNumber)
    {
        // $var type width id reference [range] $end; a range may be written apart ([7:0]) or joined to the reference.
        if (words.Count < 4 || !int.TryParse(words[1], NumberStyles.None, CultureInfo.InvariantCulture, out int width) || width < 1)
        {
            throw new VcdFormatException($"{path}:{lineNumber}: $var needs a type, a width (a whole number >= 1), an identifier and a name ($var wire 1 ! clk $end)");
        }

        string reference = string.Concat(words.Skip(3));
        int low = 0;
        int high = width - 1;
        int bracket = reference.IndexOf('[');
        if (bracket > 0)
        {
            string range = reference[(bracket + 1)..].TrimEnd(']');
            reference = reference[..bracket];
            string[] ends = range.Split(':');
            if (ends.Length == 2 && int.TryParse(ends[0], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int msb) && int.TryParse(ends[1], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int lsb))
            {
                high = msb;
                low = lsb;
            }
            else if (ends.Length == 1 && int.TryParse(ends[0], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int only))
            {
                high = only;
                low = only;
            }
        }

        string full = scopes.Count == 0 ? reference : string.Join('.', scopes) + "." + reference;
        return new VcdVariable(words[2], width, full, reference, low, high);
    }

    private static BigInteger Timescale(string text, string path, long lineNumber)
    {
        // 1, 10 or 100, then s, ms, us, ns, ps or fs (IEEE 1364 18.2.3.2, from memory).
        int digits = 0;
        while (digits < text.Length && char.IsAsciiDigit(text[digits]))
        {
            digits++;
        }

        string number = text[..digits];
        string unit = text[digits..];
        BigInteger? perUnit = unit switch
        {
            "s" => BigInteger.Pow(10, 15),
            "ms" => BigInteger.Pow(10, 12),
            "us" => BigInteger.Pow(10, 9),
            "ns" => BigInteger.Pow(10, 6),
            "ps" => 1000,
            "fs" => 1,
            _ => null,
        };
        if (number is not ("1" or "10" or "100") || perUnit == null)
        {
            throw new VcdFormatException($"{path}:{lineNumber}: $timescale must be 1, 10 or 100 and a unit s, ms, us, ns, ps or fs, got {Commands.OptionValues.Quote(text)}");
        }

        return int.Parse(number, CultureInfo.InvariantCulture) * perUnit.Value;
    }
}
