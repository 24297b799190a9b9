using System.Reflection;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// Catches an option given without its value (<c>--threshold-sigma</c> at the end of the line, or
/// followed by another option): Spectre.Console.Cli 0.57 then fills the value with its internal
/// command name instead of failing, which would reach the user as "got '__default_command'" or,
/// for a file option, silently write a file of that name. Throws <see cref="MissingOptionValueException"/>.
/// </summary>
public sealed class MissingValueInterceptor : ICommandInterceptor
{
    /// <summary>The value Spectre puts in an option whose value is missing.</summary>
    public const string SpectrePlaceholder = "__default_command";

    private readonly string[] _args;

    /// <summary>Checks against the command line as typed (a user who really typed the placeholder is left alone).</summary>
    public MissingValueInterceptor(string[] args)
    {
        _args = args;
    }

    /// <summary>
    /// For a typed option (int?, double?) Spectre fails while binding instead ("Failed to convert
    /// '__default_command'"), before <see cref="Intercept"/> runs: finds the option on the command line that
    /// takes a value (declared so by some command's settings) but is last or followed by another option.
    /// </summary>
    /// <returns>The option as typed, or null when none fits.</returns>
    public static string? OptionMissingItsValue(string[] args)
    {
        var valueOptions = new HashSet<string>(StringComparer.Ordinal);
        foreach (Type type in typeof(MissingValueInterceptor).Assembly.GetTypes())
        {
            if (!typeof(CommandSettings).IsAssignableFrom(type))
            {
                continue;
            }

            foreach (PropertyInfo property in type.GetProperties(BindingFlags.Public | BindingFlags.Instance))
            {
                CommandOptionAttribute? option = property.GetCustomAttribute<CommandOptionAttribute>();
                if (option != null && option.ValueName != null && property.PropertyType != typeof(bool))
                {
                    foreach (string name in option.LongNames)
                    {
                        valueOptions.Add("--" + name);
                    }
                }
            }
        }

        for (int i = 0; i < args.Length; i++)
        {
            bool lastOrBeforeOption = i == args.Length - 1 || (args[i + 1].StartsWith("--", StringComparison.Ordinal));
            if (valueOptions.Contains(args[i]) && lastOrBeforeOption)
            {
                return args[i];
            }
        }

        return null;
    }

    /// <inheritdoc />
    public void Intercept(CommandContext context, CommandSettings settings)
    {
        CheckPaths(settings);
        if (Array.IndexOf(_args, SpectrePlaceholder) >= 0)
        {
            return;
        }

        foreach (PropertyInfo property in settings.GetType().GetProperties(BindingFlags.Public | BindingFlags.Instance))
        {
            CommandOptionAttribute? option = property.GetCustomAttribute<CommandOptionAttribute>();
            if (option == null || property.PropertyType != typeof(string))
            {
                continue;
            }

            if (property.GetValue(settings) is string value && value == SpectrePlaceholder)
            {
                string name = option.LongNames.Count > 0 ? "--" + option.LongNames[0] : "-" + option.ShortNames[0];
                throw new MissingOptionValueException(name);
            }
        }
    }

    /// <summary>
    /// Checks every <see cref="FilePathAttribute"/> setting: an empty path, or standard input (<c>-</c>) where it
    /// cannot be read, is a usage error naming the option or argument (instead of a runtime exception deep in the command).
    /// </summary>
    /// <exception cref="CommandLineException">A path is empty or blank, or is <c>-</c> where standard input is not accepted.</exception>
    public static void CheckPaths(CommandSettings settings)
    {
        foreach (PropertyInfo property in settings.GetType().GetProperties(BindingFlags.Public | BindingFlags.Instance))
        {
            FilePathAttribute? path = property.GetCustomAttribute<FilePathAttribute>();
            if (path == null || property.GetValue(settings) is not string value)
            {
                continue;
            }

            string name = NameOf(property);
            if (string.IsNullOrWhiteSpace(value))
            {
                throw new CommandLineException($"{name} is an empty path: expected a file name{(path.StandardInput ? " (or - for standard input)" : string.Empty)}");
            }

            if (StandardStreams.IsInput(value) && !path.StandardInput)
            {
                throw new CommandLineException($"{name} cannot be - (standard input): expected a file name");
            }
        }
    }

    private static string NameOf(PropertyInfo property)
    {
        if (property.GetCustomAttribute<CommandOptionAttribute>() is { } option)
        {
            return option.LongNames.Count > 0 ? "--" + option.LongNames[0] : "-" + option.ShortNames[0];
        }

        if (property.GetCustomAttribute<CommandArgumentAttribute>() is { } argument)
        {
            return "<" + argument.ValueName + ">";
        }

        return property.Name;
    }
}
