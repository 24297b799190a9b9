using System.ComponentModel;
using System.Reflection;
using FreqReadout.Host.Commands;
using Spectre.Console.Cli;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// The project's CLI convention: every value option's description states its default ("Default ...", or "Required." for
/// an option the command cannot run without). Checked on the newest commands' settings (plan, import vcd, import wav,
/// bench speed); older commands still have options without it (see the review notes).
/// </summary>
public class OptionDefaultsStatedTests
{
    [Theory]
    [InlineData(typeof(PlanCommand.Settings))]
    [InlineData(typeof(ImportVcdCommand.Settings))]
    [InlineData(typeof(ImportWavCommand.Settings))]
    [InlineData(typeof(BenchSpeedCommand.Settings))]
    public void Every_value_option_states_its_default_or_that_it_is_required(Type settings)
    {
        var missing = new List<string>();
        foreach (PropertyInfo p in settings.GetProperties())
        {
            CommandOptionAttribute? option = p.GetCustomAttribute<CommandOptionAttribute>();
            if (option == null || option.ValueName == null)
            {
                continue; // a flag (--json, --quick) has no value to default
            }

            string description = p.GetCustomAttribute<DescriptionAttribute>()?.Description ?? string.Empty;
            if (!description.Contains("default", StringComparison.OrdinalIgnoreCase) && !description.Contains("Required.", StringComparison.Ordinal))
            {
                missing.Add(string.Join("/", option.LongNames));
            }
        }

        Assert.True(missing.Count == 0, "no default stated: --" + string.Join(", --", missing));
    }
}
