using Spectre.Console;

namespace FreqReadout.Host.Commands;

/// <summary>Reports a fraction done (0..1) of long work to a Spectre progress task, whatever its MaxValue.</summary>
internal sealed class ProgressTaskReporter : IProgress<double>
{
    private readonly ProgressTask _task;

    public ProgressTaskReporter(ProgressTask task) => _task = task;

    public void Report(double value) => _task.Value = Math.Clamp(value, 0.0, 1.0) * _task.MaxValue;
}
