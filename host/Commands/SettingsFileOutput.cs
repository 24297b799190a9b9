using System.Text;
using FreqReadout.Counting;
using FreqReadout.Host.Output;
using FreqReadout.Readout;
using FreqReadout.Settings;

namespace FreqReadout.Host.Commands;

/// <summary>Writes a device settings file (docs/settings-format.md) for <c>--settings-out</c> of calibrate and tune, through the shared formatter the device reads.</summary>
public static class SettingsFileOutput
{
    /// <summary>
    /// Takes the device's values from the settings objects (<see cref="DeviceSettingsValues.TryTakeFrom"/>), formats them,
    /// writes them to <paramref name="file"/> and commits <paramref name="outputs"/>; 0 with <paramref name="values"/>
    /// set, or the exit code after a one-line error naming <paramref name="path"/>.
    /// </summary>
    public static int Write(OutputFileSet outputs, OutputFile file, string path, CounterSettings counter, ReadoutSettings readout, out DeviceSettingsValues values)
    {
        values = new DeviceSettingsValues();
        if (!values.TryTakeFrom(counter, readout, out string? takeError) || !DeviceSettingsFormatter.TryFormat(values, out string text, out string formatError))
        {
            return CommandOutput.Fail($"--settings-out {path}: these settings cannot be written for the device: {takeError ?? "format"}", CommandOutput.BadInput);
        }

        try
        {
            byte[] bytes = Encoding.ASCII.GetBytes(text);
            file.Stream.Write(bytes, 0, bytes.Length);
            outputs.Commit();
            return ExitCodes.Ok;
        }
        catch (OutputFileException e)
        {
            return CommandOutput.Fail(e.Message, e.ExitCode);
        }
    }
}
