using System.ComponentModel;
using System.Reflection;
using FreqReadout.Host.Commands;
using Spectre.Console.Cli;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// The project's CLI convention: every value option's description states its default ("Default ...", or "Required" (with when) for
/// an option the command cannot run without), on every command's settings in the program.
/// </summary>
public class OptionDefaultsStatedTests
{
    public static TheoryData<string> AllSettings()
    {
        var data = new TheoryData<string>();
        foreach (Type t in typeof(PlanCommand).Assembly.GetTypes().Where(t => typeof(CommandSettings).IsAssignableFrom(t) && !t.IsAbstract))
        {
            data.Add(t.FullName!);
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(AllSettings))]
    public void Every_value_option_states_its_default_or_that_it_is_required(string settingsType)
    {
        Type settings = typeof(PlanCommand).Assembly.GetType(settingsType)!;
        var missing = new List<string>();
        foreach (PropertyInfo p in settings.GetProperties())
        {
            CommandOptionAttribute? option = p.GetCustomAttribute<CommandOptionAttribute>();
            if (option == null || option.ValueName == null)
            {
                continue; // a flag (--json, --quick) has no value to default
            }

            string description = p.GetCustomAttribute<DescriptionAttribute>()?.Description ?? string.Empty;
            if (!description.Contains("default", StringComparison.OrdinalIgnoreCase) && !description.Contains("Required", StringComparison.Ordinal))
            {
                missing.Add(string.Join("/", option.LongNames));
            }
        }

        Assert.True(missing.Count == 0, settings.FullName + ": no default stated: --" + string.Join(", --", missing));
    }
}
