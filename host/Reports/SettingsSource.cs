namespace FreqReadout.Host.Reports;

/// <summary>One settings object for <see cref="SettingsTable"/> and the name its rows carry ("readout", "counter", "command").</summary>
public sealed record SettingsSource(string Name, object Settings);
