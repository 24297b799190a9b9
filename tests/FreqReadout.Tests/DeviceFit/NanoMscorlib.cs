namespace FreqReadout.Tests.DeviceFit;

/// <summary>Finds the nanoFramework mscorlib (package nanoFramework.CoreLibrary 1.17.11) the device assembly is compiled against.</summary>
internal static class NanoMscorlib
{
    public const string PackageVersion = "1.17.11";

    /// <summary>
    /// The copy the firmware build put beside the device assembly, else the NuGet package's
    /// lib/mscorlib.dll (under NUGET_PACKAGES, or ~/.nuget/packages).
    /// </summary>
    public static string FindPath(string deviceAssemblyPath)
    {
        string beside = Path.Combine(Path.GetDirectoryName(deviceAssemblyPath)!, "mscorlib.dll");
        if (File.Exists(beside))
        {
            return beside;
        }

        string packages = Environment.GetEnvironmentVariable("NUGET_PACKAGES") is { Length: > 0 } env
            ? env
            : Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), ".nuget", "packages");
        string package = Path.Combine(packages, "nanoframework.corelibrary", PackageVersion, "lib", "mscorlib.dll");
        if (!File.Exists(package))
        {
            throw new FileNotFoundException("nanoFramework mscorlib not found: looked for " + beside + " and " + package + " (build firmware/ first: dotnet build FreqReadout.sln)");
        }

        return package;
    }
}
