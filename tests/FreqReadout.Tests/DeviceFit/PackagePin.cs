namespace FreqReadout.Tests.DeviceFit;

/// <summary>One nanoFramework package the deployable project (firmware/FreqReadout.Firmware.nfproj) is pinned to, with where the pin comes from.</summary>
/// <param name="Id">NuGet package id.</param>
/// <param name="Version">Pinned version.</param>
/// <param name="Assembly">The assembly in the package's lib/ folder, without ".dll".</param>
/// <param name="Source">Repository, nuspec, tag and commit the dependencies were read from.</param>
/// <param name="Dependencies">The nuspec's dependencies at that tag, "id version" each.</param>
internal sealed record PackagePin(string Id, string Version, string Assembly, string Source, string[] Dependencies);
