using FreqReadout.Link;

namespace FreqReadout.Host.Recording;

/// <summary>What a <see cref="LinkCaptureRecorder"/> tells the command as frames arrive (a live view, messages on standard error).</summary>
public interface IRecordingObserver
{
    /// <summary>A capture file was opened.</summary>
    void CaptureOpened(string path, CaptureHeaderPayload header);

    /// <summary>A capture file was closed; <paramref name="why"/> is its trailer's <c>closed_by</c>.</summary>
    void CaptureClosed(string path, long rows, string why);

    /// <summary>A gate's reading arrived.</summary>
    void ReadingReceived(ReadingPayload reading);

    /// <summary>A detection event arrived.</summary>
    void EventReceived(EventPayload detection);

    /// <summary>A status frame arrived.</summary>
    void StatusReceived(StatusPayload status);

    /// <summary>The device sent the settings text in force.</summary>
    void SettingsReceived(string text);
}
