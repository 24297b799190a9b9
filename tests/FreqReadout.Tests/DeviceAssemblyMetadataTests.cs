using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;

namespace FreqReadout.Tests;

/// <summary>
/// nanoFramework 1.17 compiles generics but cannot run them. This reads the compiled device assembly
/// (firmware/, built against nanoFramework.CoreLibrary's mscorlib) and fails on anything the device
/// cannot load: a reference to another assembly than mscorlib 1.17, a generic parameter, a method
/// spec, or a type spec that is a generic instantiation.
/// </summary>
public class DeviceAssemblyMetadataTests
{
    internal static string FindDeviceAssembly()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir != null && !File.Exists(Path.Combine(dir.FullName, "FreqReadout.sln")))
        {
            dir = dir.Parent;
        }

        Assert.True(dir != null, "FreqReadout.sln not found above " + AppContext.BaseDirectory);
        string configuration = new DirectoryInfo(AppContext.BaseDirectory).Parent!.Name; // .../bin/<Configuration>/net10.0/
        string path = Path.Combine(dir!.FullName, "firmware", "bin", configuration, "netstandard2.0", "FreqReadout.Firmware.dll");
        Assert.True(File.Exists(path), "device assembly not built: " + path);
        return path;
    }

    [Fact]
    public void Device_assembly_references_only_nanoFramework_mscorlib_1_17()
    {
        using var pe = new PEReader(File.OpenRead(FindDeviceAssembly()));
        MetadataReader md = pe.GetMetadataReader();
        Assert.NotEmpty(md.AssemblyReferences);
        foreach (AssemblyReferenceHandle h in md.AssemblyReferences)
        {
            AssemblyReference r = md.GetAssemblyReference(h);
            string name = md.GetString(r.Name);
            Assert.True(name == "mscorlib", "device assembly references " + name + ", the device has only mscorlib");
            Assert.True(r.Version.Major == 1 && r.Version.Minor == 17, "device assembly references mscorlib " + r.Version + ", expected 1.17.x");
        }
    }

    [Fact]
    public void Device_assembly_holds_no_generics()
    {
        using var pe = new PEReader(File.OpenRead(FindDeviceAssembly()));
        MetadataReader md = pe.GetMetadataReader();

        Assert.True(md.TypeDefinitions.Count > 5, "device assembly looks empty");
        var generic = new List<string>();
        foreach (TypeDefinitionHandle t in md.TypeDefinitions)
        {
            TypeDefinition type = md.GetTypeDefinition(t);
            if (type.GetGenericParameters().Count > 0)
            {
                generic.Add(md.GetString(type.Name));
            }

            foreach (MethodDefinitionHandle mh in type.GetMethods())
            {
                MethodDefinition method = md.GetMethodDefinition(mh);
                if (method.GetGenericParameters().Count > 0)
                {
                    generic.Add(md.GetString(type.Name) + "." + md.GetString(method.Name));
                }
            }
        }

        Assert.True(md.GetTableRowCount(TableIndex.GenericParam) == 0, "generic parameters on: " + string.Join(", ", generic));
        Assert.True(md.GetTableRowCount(TableIndex.MethodSpec) == 0, "method specs (generic method instantiations) found");
        Assert.True(md.GetTableRowCount(TableIndex.GenericParamConstraint) == 0, "generic parameter constraints found");

        int typeSpecs = md.GetTableRowCount(TableIndex.TypeSpec);
        for (int row = 1; row <= typeSpecs; row++)
        {
            TypeSpecification spec = md.GetTypeSpecification(MetadataTokens.TypeSpecificationHandle(row));
            BlobReader blob = md.GetBlobReader(spec.Signature);
            SignatureTypeCode code = blob.ReadSignatureTypeCode();
            Assert.True(code != SignatureTypeCode.GenericTypeInstance, "type spec " + row + " is a generic instantiation");
        }

        // Member references whose parent is a type spec point into generic instantiations too.
        foreach (MemberReferenceHandle h in md.MemberReferences)
        {
            MemberReference m = md.GetMemberReference(h);
            if (m.Parent.Kind == HandleKind.TypeSpecification)
            {
                TypeSpecification spec = md.GetTypeSpecification((TypeSpecificationHandle)m.Parent);
                BlobReader blob = md.GetBlobReader(spec.Signature);
                Assert.True(blob.ReadSignatureTypeCode() != SignatureTypeCode.GenericTypeInstance,
                    "member " + md.GetString(m.Name) + " is on a generic instantiation");
            }
        }
    }
}
