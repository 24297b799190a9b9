using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using Spectre.Console.Cli;

namespace FreqReadout.Host;

/// <summary>Entry point of the <c>freqreadout</c> command-line harness.</summary>
public static class Program
{
    public static int Main(string[] args)
    {
        if (args.Length == 2 && args[0] == Bench.RawRead.Argument)
        {
            return Bench.RawRead.Run(args[1]); // the speed bench's yardstick: nothing else loaded (host/Bench/README.md)
        }

        int exit = Run(args);
        if (Environment.GetEnvironmentVariable(Bench.SpeedBench.PeakMemoryVariable) is { Length: > 0 } peakFile)
        {
            // The speed bench reads each child's peak working set here (a process's own figure is gone once it exits).
            File.WriteAllText(peakFile, Environment.WorkingSet.ToString(System.Globalization.CultureInfo.InvariantCulture) + " " +
                System.Diagnostics.Process.GetCurrentProcess().PeakWorkingSet64.ToString(System.Globalization.CultureInfo.InvariantCulture));
        }

        return exit;
    }

    private static int Run(string[] args)
    {
        // Numbers in messages and output use '.' whatever the machine's culture (the capture contract's rule).
        System.Globalization.CultureInfo.DefaultThreadCurrentCulture = System.Globalization.CultureInfo.InvariantCulture;
        System.Globalization.CultureInfo.CurrentCulture = System.Globalization.CultureInfo.InvariantCulture;
        if (Environment.GetEnvironmentVariable("FREQREADOUT_ROW_READER") == "1")
        {
            CaptureFile.RowByRowReading = true; // the line-based oracle of the fast reading path (DEVELOPERS.md)
        }

        if (args.Length == 0)
        {
            // No command: the help, and the usage exit code (nothing was done).
            BuildApp(args).Run(new[] { "--help" });
            return ExitCodes.Usage;
        }

        if (args.Length == 1 && args[0] == "--version")
        {
            Console.Out.WriteLine(VersionText());
            return ExitCodes.Ok;
        }

        args = StandardStreams.MapArguments(args);
        try
        {
            return BuildApp(args).Run(args);
        }
        catch (MissingOptionValueException e)
        {
            Console.Error.WriteLine("error: " + e.Message + "; see freqreadout --help");
            return ExitCodes.Usage;
        }
        catch (CommandLineException e)
        {
            Console.Error.WriteLine("error: " + e.Message + "; see freqreadout --help");
            return ExitCodes.Usage;
        }
        catch (CommandAppException e)
        {
            // Usage errors (unknown option, missing argument, a value of the wrong type): one line, no stack trace.
            string all = e.Message + " " + e.InnerException?.Message;
            if (all.Contains(MissingValueInterceptor.SpectrePlaceholder, StringComparison.Ordinal)
                && Array.IndexOf(args, MissingValueInterceptor.SpectrePlaceholder) < 0
                && MissingValueInterceptor.OptionMissingItsValue(args) is string missing)
            {
                Console.Error.WriteLine("error: " + missing + " needs a value; see freqreadout --help");
                return ExitCodes.Usage;
            }

            if (ConversionError(e.Message + " " + e.InnerException?.Message, args) is string conversion)
            {
                Console.Error.WriteLine("error: " + conversion + "; see freqreadout --help");
                return ExitCodes.Usage;
            }

            string detail = e.InnerException is { } inner && inner.Message != e.Message ? " (" + inner.Message + ")" : string.Empty;
            Console.Error.WriteLine("error: " + TextExcerpt.Plain(e.Message.TrimEnd('.') + detail, 400) + "; see freqreadout --help");
            return ExitCodes.Usage;
        }
        catch (OperationCanceledException)
        {
            Console.Error.WriteLine("error: interrupted");
            return ExitCodes.Interrupted;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            // A file that went away or a disk that failed mid-run (commands handle opening and writing themselves).
            Console.Error.WriteLine("error: " + e.Message.TrimEnd('.'));
            return ExitCodes.DataError;
        }
        catch (Exception e) when (Environment.GetEnvironmentVariable("FREQREADOUT_TRACE") != "1")
        {
            // A bug: one line for the user; FREQREADOUT_TRACE=1 lets the exception (and its stack trace) through.
            Console.Error.WriteLine($"error: unexpected {e.GetType().Name}: {e.Message.Split('\n')[0].TrimEnd('.')} (a bug in freqreadout; run with FREQREADOUT_TRACE=1 for the stack trace)");
            return ExitCodes.Bug;
        }
    }

    /// <summary>The <c>--version</c> line: the program's version and the capture format versions it reads and writes.</summary>
    public static string VersionText()
    {
        var assembly = typeof(Program).Assembly;
        string version = System.Reflection.CustomAttributeExtensions.GetCustomAttribute<System.Reflection.AssemblyInformationalVersionAttribute>(assembly)?.InformationalVersion
            ?? assembly.GetName().Version?.ToString() ?? "unknown";
        int plus = version.IndexOf('+');
        if (plus > 0)
        {
            version = version[..plus]; // no build metadata (source revision) in the user-facing line
        }

        return $"freqreadout {version} (text capture format 1, binary capture format {BinaryCaptureFormat.Version})";
    }

    /// <summary>
    /// Spectre's "Failed to convert 'X' to Nullable`1" (an option value of the wrong type) as a line that
    /// names the option and what it takes; null for any other message.
    /// </summary>
    internal static string? ConversionError(string message, string[] args)
    {
        var match = System.Text.RegularExpressions.Regex.Match(message, @"^Failed to convert '(?<value>.*)' to ");
        if (!match.Success)
        {
            return null;
        }

        string value = match.Groups["value"].Value;
        string kind = message.Contains("Int32", StringComparison.Ordinal) || message.Contains("Int64", StringComparison.Ordinal)
            ? "a whole number (digits only)"
            : message.Contains("Double", StringComparison.Ordinal) ? "a number with '.' as the decimal separator" : "a value of another kind";
        string option = "an option";
        for (int i = 0; i < args.Length; i++)
        {
            if (args[i] == value && i > 0 && args[i - 1].StartsWith("-", StringComparison.Ordinal))
            {
                option = args[i - 1];
                break;
            }

            int eq = args[i].IndexOf('=');
            if (args[i].StartsWith("-", StringComparison.Ordinal) && eq > 0 && args[i][(eq + 1)..] == value)
            {
                option = args[i][..eq];
                break;
            }
        }

        return $"{option} must be {kind}, got {TextExcerpt.Quote(value)}";
    }

    /// <summary>The top-level command names (commands and branches) in the order they are registered.</summary>
    internal static readonly string[] CommandNames = { "demo", "count", "replay", "calibrate", "convert", "simulate", "coil", "plan", "stability", "tune", "import", "record", "bench" };

    /// <summary>The command tree; tests run commands through this too.</summary>
    public static CommandApp BuildApp() => BuildApp(Array.Empty<string>());

    /// <summary>The command tree for the command line <paramref name="args"/> (checked for options given without their value).</summary>
    public static CommandApp BuildApp(string[] args)
    {
        // Start-up: Spectre builds its model of every registered command (reflection over each settings type) before
        // it runs one. When the first argument names a command, only that command is registered: the same parsing,
        // help and errors for it, in less time. Anything else (no command, --help, a misspelt name) gets them all.
        string? only = args.Length > 0 && Array.IndexOf(CommandNames, args[0]) >= 0 ? args[0] : null;
        bool Wanted(string name) => only == null || only == name;
        var app = new CommandApp();
        app.Configure(config =>
        {
            config.SetApplicationName("freqreadout");
            config.SetInterceptor(new MissingValueInterceptor(args));
            config.PropagateExceptions();
            config.UseStrictParsing(); // an unknown or misspelt option is an error, never silently ignored
            if (Wanted("demo"))
            {
                config.AddCommand<DemoCommand>("demo")
                    .WithDescription("Run the whole pipeline on a built-in invented scenario.");
            }

            if (Wanted("count"))
            {
                config.AddCommand<CountCommand>("count")
                    .WithDescription("Count a capture gate by gate: frequency, shift from the first gate, edges, error, state.");
            }

            if (Wanted("replay"))
            {
                config.AddCommand<ReplayCommand>("replay")
                    .WithDescription("Replay a capture through the device's readout pipeline: baseline, noise, drift, re-baselines and events (ferrous / non-ferrous / unclear).");
            }

            if (Wanted("calibrate"))
            {
                config.AddCommand<CalibrateCommand>("calibrate")
                    .WithDescription("Fit the search oscillator's tempco (ppm/K with its standard error) from the target-free stretches of a capture with temp_c.");
            }

            if (Wanted("convert"))
            {
                config.AddCommand<ConvertCommand>("convert")
                    .WithDescription("Convert a capture between the text and binary formats, losslessly, optionally trimmed to a time range.");
            }

            if (Wanted("simulate"))
            {
                config.AddCommand<SimulateCommand>("simulate")
                    .WithDescription("Generate a capture from physics (scene file or built-in demo scene) plus a truth file.");
            }

            if (Wanted("coil"))
            {
                config.AddCommand<CoilCommand>("coil")
                    .WithDescription("Search coil figures and a target's expected shift against distance and its ferrous crossover.");
            }

            if (Wanted("plan"))
            {
                config.AddCommand<PlanCommand>("plan")
                    .WithDescription("Before soldering: predicted resolution, update rate and device load of each timestamp method and estimator, what counting the beat note gains, and how deep a target is seen.");
            }

            if (Wanted("stability"))
            {
                config.AddCommand<StabilityCommand>("stability")
                    .WithDescription("Allan and modified Allan deviation of an edge capture taken with no target, with intervals, noise types and the gate they recommend.");
            }

            if (Wanted("tune"))
            {
                config.AddCommand<TuneCommand>("tune")
                    .WithDescription("Replay a capture once per value of one setting, in parallel, and tabulate the events, classes and re-baselines each finds; optionally write the device settings file for the value picked.");
            }

            if (Wanted("import"))
            {
                config.AddBranch("import", import =>
                {
                    import.SetDescription("Turn recordings made with other tools into captures.");
                    import.AddCommand<ImportVcdCommand>("vcd")
                        .WithDescription("The rising edges of one signal of a logic analyser's value change dump, timed by the analyser's real sample period.");
                    import.AddCommand<ImportWavCommand>("wav")
                        .WithDescription("An audio recording of the beat note: the tone's rising zero crossings, band-passed, as a beat capture; lost stretches reported.");
                });
            }

            if (Wanted("record"))
            {
                config.AddCommand<RecordCommand>("record")
                    .WithDescription("Record what the device streams over its serial link into a capture, written as it arrives; --live shows the readings; --list lists serial ports.");
            }

            if (Wanted("bench"))
            {
                config.AddBranch("bench", bench =>
                {
                    bench.SetDescription("Benches: tracking quality on simulated scenes, and speed.");
                    bench.AddCommand<BenchQualityCommand>("quality")
                        .WithDescription("Tracking quality: seeded drift scenes of every kind and mode through the readout and two plain ways; targets found, classified right, false events per hour, peak-shift error.");
                    bench.AddCommand<BenchSpeedCommand>("speed")
                        .WithDescription("Speed: times raw read, text and binary replay, start-up and simulate as whole processes, interleaved, and prints medians and ratios to the raw read.");
                });
            }
        });
        return app;
    }
}
