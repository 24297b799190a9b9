using FreqReadout.Detection;

namespace FreqReadout.Host.Replay;

/// <summary>An event in a replay report: the pipeline's <see cref="DetectionEvent"/> plus its UTC start when the capture's start is known.</summary>
public sealed record ReplayEvent(DetectionEvent Event, DateTimeOffset? StartUtc)
{
    /// <summary>The JSON contract's class text.</summary>
    public string ClassName => ClassText(Event.Class);

    /// <summary>What ended an event, as the readings CSV and the docs name it.</summary>
    public static string EndText(EventEnd end) => end switch
    {
        EventEnd.Released => "released",
        EventEnd.NoSignal => "no_signal",
        EventEnd.Rebaseline => "rebaseline",
        EventEnd.EndOfRun => "end_of_run",
        EventEnd.AutoRebaseline => "auto_rebaseline",
        EventEnd.Resolved => "resolved",
        _ => "released",
    };

    /// <summary>ferrous, non-ferrous or unclear.</summary>
    public static string ClassText(TargetClass c) => c switch
    {
        TargetClass.Ferrous => "ferrous",
        TargetClass.NonFerrous => "non-ferrous",
        TargetClass.Unclear => "unclear",
        _ => "none",
    };
}
