namespace FreqReadout.ReportBrowserCheck;

/// <summary>A rectangle on the page, CSS pixels (one screenshot pixel each at device scale factor 1).</summary>
public sealed record PageRect(int Left, int Top, int Width, int Height);
