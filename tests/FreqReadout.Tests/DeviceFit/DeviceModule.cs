using System.Collections.Immutable;
using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// One assembly read with System.Reflection.Metadata: its methods under readable names ("Type.Method",
/// with the parameter types when a type has overloads of that name), their IL and locals, call targets,
/// and types classified as primitive, enum, struct or reference. Types referenced from mscorlib are
/// looked up in nanoFramework's own mscorlib (<paramref name="corlib"/>), so an enum there is told
/// from a struct by its base type, not by a list kept here.
/// </summary>
internal sealed class DeviceModule : IDisposable
{
    private static readonly Dictionary<string, string> PrimitiveNames = new()
    {
        ["System.Boolean"] = "bool", ["System.Char"] = "char", ["System.SByte"] = "sbyte", ["System.Byte"] = "byte",
        ["System.Int16"] = "short", ["System.UInt16"] = "ushort", ["System.Int32"] = "int", ["System.UInt32"] = "uint",
        ["System.Int64"] = "long", ["System.UInt64"] = "ulong", ["System.Single"] = "float", ["System.Double"] = "double",
        ["System.IntPtr"] = "IntPtr", ["System.UIntPtr"] = "UIntPtr",
    };

    private readonly PEReader pe;
    private readonly DeviceModule? corlib;
    private readonly IReadOnlyDictionary<string, DeviceModule> references;
    private readonly DeviceTypeProvider provider;
    private readonly Dictionary<string, TypeDefinitionHandle> typesByFullName = new();
    private readonly Dictionary<EntityHandle, DeviceType> classified = new();
    private readonly Dictionary<MethodDefinitionHandle, string> methodNames = new();

    private DeviceModule(string name, PEReader pe, DeviceModule? corlib, IReadOnlyDictionary<string, DeviceModule>? references = null)
    {
        Name = name;
        this.pe = pe;
        this.corlib = corlib;
        this.references = references ?? new Dictionary<string, DeviceModule>();
        Reader = pe.GetMetadataReader();
        provider = new DeviceTypeProvider(this);
        foreach (TypeDefinitionHandle h in Reader.TypeDefinitions)
        {
            typesByFullName[FullName(h)] = h;
        }
    }

    /// <summary>The file name (or snippet name) used in messages.</summary>
    public string Name { get; }

    public MetadataReader Reader { get; }

    /// <summary>Opens a device assembly (or compiled snippet) and the nanoFramework mscorlib it was compiled against.</summary>
    public static DeviceModule Open(string path, string mscorlibPath)
    {
        return Load(Path.GetFileName(path), File.ReadAllBytes(path), mscorlibPath);
    }

    /// <summary>Reads an assembly image held in memory (a compiled snippet).</summary>
    public static DeviceModule Load(string name, byte[] image, string mscorlibPath)
    {
        var corlib = new DeviceModule(Path.GetFileName(mscorlibPath), new PEReader(File.ReadAllBytes(mscorlibPath).ToImmutableArray()), null);
        return new DeviceModule(name, new PEReader(image.ToImmutableArray()), corlib);
    }

    /// <summary>
    /// Opens an assembly that also references other assemblies besides mscorlib (the board adapters reference the
    /// firmware assembly and the compile-only shim): their types are classified from their own metadata.
    /// </summary>
    public static DeviceModule OpenWithReferences(string path, string mscorlibPath, IEnumerable<string> referencePaths)
    {
        var corlib = new DeviceModule(Path.GetFileName(mscorlibPath), new PEReader(File.ReadAllBytes(mscorlibPath).ToImmutableArray()), null);
        var references = new Dictionary<string, DeviceModule>(StringComparer.Ordinal);
        foreach (string referencePath in referencePaths)
        {
            var module = new DeviceModule(Path.GetFileName(referencePath), new PEReader(File.ReadAllBytes(referencePath).ToImmutableArray()), corlib);
            references[module.Reader.GetString(module.Reader.GetAssemblyDefinition().Name)] = module;
        }

        return new DeviceModule(Path.GetFileName(path), new PEReader(File.ReadAllBytes(path).ToImmutableArray()), corlib, references);
    }

    /// <summary>Every method defined in the assembly.</summary>
    public IEnumerable<MethodDefinitionHandle> Methods()
    {
        foreach (TypeDefinitionHandle t in Reader.TypeDefinitions)
        {
            foreach (MethodDefinitionHandle m in Reader.GetTypeDefinition(t).GetMethods())
            {
                yield return m;
            }
        }
    }

    /// <summary>"Type.Method", or "Type.Method(int, double)" when the type has overloads of that name; nested types as Outer.Inner.</summary>
    public string MethodName(MethodDefinitionHandle handle)
    {
        if (methodNames.TryGetValue(handle, out string? cached))
        {
            return cached;
        }

        MethodDefinition method = Reader.GetMethodDefinition(handle);
        TypeDefinition type = Reader.GetTypeDefinition(method.GetDeclaringType());
        string simple = Reader.GetString(method.Name);
        int sameName = type.GetMethods().Count(m => Reader.StringComparer.Equals(Reader.GetMethodDefinition(m).Name, simple));
        string name = ShortName(method.GetDeclaringType()) + "." + simple;
        if (sameName > 1)
        {
            MethodSignature<DeviceType> sig = method.DecodeSignature(provider, null);
            name += "(" + string.Join(", ", sig.ParameterTypes) + ")";
        }

        methodNames[handle] = name;
        return name;
    }

    /// <summary>True for instance and static constructors (.ctor, .cctor).</summary>
    public bool IsConstructor(MethodDefinitionHandle handle)
    {
        string name = Reader.GetString(Reader.GetMethodDefinition(handle).Name);
        return name == ".ctor" || name == ".cctor";
    }

    /// <summary>True for a method declared on an interface (a port the board adapters implement).</summary>
    public bool IsInterfaceMethod(MethodDefinitionHandle handle)
    {
        TypeDefinition type = Reader.GetTypeDefinition(Reader.GetMethodDefinition(handle).GetDeclaringType());
        return (type.Attributes & System.Reflection.TypeAttributes.Interface) != 0;
    }

    /// <summary>True when a call to the method may run an override elsewhere (virtual, not final, on an unsealed class).</summary>
    public bool IsOverridable(MethodDefinitionHandle handle)
    {
        MethodDefinition method = Reader.GetMethodDefinition(handle);
        TypeDefinition type = Reader.GetTypeDefinition(method.GetDeclaringType());
        return (method.Attributes & System.Reflection.MethodAttributes.Virtual) != 0
            && (method.Attributes & System.Reflection.MethodAttributes.Final) == 0
            && (type.Attributes & System.Reflection.TypeAttributes.Sealed) == 0;
    }

    /// <summary>Every method of the assembly with the given <see cref="MethodName"/>; empty when none.</summary>
    public IReadOnlyList<MethodDefinitionHandle> FindMethods(string name)
    {
        return Methods().Where(m => MethodName(m) == name).ToList();
    }

    /// <summary>The method's body, or null for abstract, interface and extern methods.</summary>
    public MethodBodyBlock? Body(MethodDefinitionHandle handle)
    {
        MethodDefinition method = Reader.GetMethodDefinition(handle);
        return method.RelativeVirtualAddress == 0 ? null : pe.GetMethodBody(method.RelativeVirtualAddress);
    }

    /// <summary>Start and end offsets of the method's try blocks, handlers and filters (they start basic blocks).</summary>
    public IEnumerable<int> ExceptionRegionOffsets(MethodDefinitionHandle handle)
    {
        MethodBodyBlock? body = Body(handle);
        if (body == null)
        {
            yield break;
        }

        foreach (ExceptionRegion r in body.ExceptionRegions)
        {
            yield return r.TryOffset;
            yield return r.TryOffset + r.TryLength;
            yield return r.HandlerOffset;
            yield return r.HandlerOffset + r.HandlerLength;
            if (r.Kind == ExceptionRegionKind.Filter)
            {
                yield return r.FilterOffset;
            }
        }
    }

    /// <summary>The method's IL, decoded; empty without a body.</summary>
    public IReadOnlyList<IlInstruction> Instructions(MethodDefinitionHandle handle)
    {
        MethodBodyBlock? body = Body(handle);
        return body == null ? [] : IlDecoder.Decode(body.GetILBytes() ?? [], Name + ": " + MethodName(handle));
    }

    /// <summary>The types of the method's locals (decoded from its local signature blob).</summary>
    public ImmutableArray<DeviceType> Locals(MethodDefinitionHandle handle)
    {
        MethodBodyBlock? body = Body(handle);
        if (body == null || body.LocalSignature.IsNil)
        {
            return [];
        }

        return Reader.GetStandaloneSignature(body.LocalSignature).DecodeLocalSignature(provider, null);
    }

    /// <summary>The type a type token (TypeDef, TypeRef, TypeSpec) names.</summary>
    public DeviceType TypeOfToken(int token) => Classify(MetadataTokens.EntityHandle(token));

    /// <summary>The declaring type of the method a call or newobj token names.</summary>
    public DeviceType DeclaringTypeOfMethodToken(int token)
    {
        EntityHandle h = MetadataTokens.EntityHandle(token);
        switch (h.Kind)
        {
            case HandleKind.MethodDefinition:
                return Classify(Reader.GetMethodDefinition((MethodDefinitionHandle)h).GetDeclaringType());
            case HandleKind.MemberReference:
                return Classify(Reader.GetMemberReference((MemberReferenceHandle)h).Parent);
            case HandleKind.MethodSpecification:
                return DeclaringTypeOfMethodToken(MetadataTokens.GetToken(Reader.GetMethodSpecification((MethodSpecificationHandle)h).Method));
            default:
                throw new InvalidDataException(Name + ": token 0x" + token.ToString("X8") + " is not a method");
        }
    }

    /// <summary>
    /// What a call, callvirt or newobj token targets: a method of this assembly (which may have no
    /// body: an interface or abstract method), or a method outside it named "Type.Method(params)".
    /// </summary>
    public bool TryGetLocalMethod(int token, out MethodDefinitionHandle method, out string externalName)
    {
        EntityHandle h = MetadataTokens.EntityHandle(token);
        if (h.Kind == HandleKind.MethodSpecification)
        {
            h = Reader.GetMethodSpecification((MethodSpecificationHandle)h).Method;
        }

        if (h.Kind == HandleKind.MethodDefinition)
        {
            method = (MethodDefinitionHandle)h;
            externalName = "";
            return true;
        }

        if (h.Kind != HandleKind.MemberReference)
        {
            throw new InvalidDataException(Name + ": token 0x" + token.ToString("X8") + " is not a method");
        }

        MemberReference member = Reader.GetMemberReference((MemberReferenceHandle)h);
        MethodSignature<DeviceType> sig = member.DecodeMethodSignature(provider, null);
        method = default;
        externalName = Classify(member.Parent).Name + "." + Reader.GetString(member.Name) + "(" + string.Join(", ", sig.ParameterTypes) + ")";
        return false;
    }

    /// <summary>Classifies a TypeDef, TypeRef or TypeSpec handle of this assembly.</summary>
    public DeviceType Classify(EntityHandle handle)
    {
        if (classified.TryGetValue(handle, out DeviceType? known))
        {
            return known;
        }

        DeviceType result;
        switch (handle.Kind)
        {
            case HandleKind.TypeDefinition:
                result = ClassifyDefinition((TypeDefinitionHandle)handle);
                break;
            case HandleKind.TypeReference:
                result = ClassifyReference((TypeReferenceHandle)handle);
                break;
            case HandleKind.TypeSpecification:
                result = Reader.GetTypeSpecification((TypeSpecificationHandle)handle).DecodeSignature(provider, null);
                break;
            default:
                throw new InvalidDataException(Name + ": handle of kind " + handle.Kind + " is not a type");
        }

        classified[handle] = result;
        return result;
    }

    public void Dispose()
    {
        pe.Dispose();
        corlib?.Dispose();
        foreach (DeviceModule referenced in references.Values)
        {
            referenced.Dispose();
        }
    }

    private DeviceType ClassifyDefinition(TypeDefinitionHandle handle)
    {
        TypeDefinition type = Reader.GetTypeDefinition(handle);
        string fullName = FullName(handle);
        string shortName = ShortName(handle);
        if (PrimitiveNames.TryGetValue(fullName, out string? primitive))
        {
            return new DeviceType(primitive, DeviceTypeKind.Primitive);
        }

        string baseName = type.BaseType.IsNil ? "" : BaseTypeName(type.BaseType);
        if (baseName == "System.Enum")
        {
            return new DeviceType(shortName, DeviceTypeKind.Enum);
        }

        if (baseName == "System.ValueType" && fullName != "System.Enum")
        {
            return new DeviceType(shortName, DeviceTypeKind.Struct);
        }

        return new DeviceType(shortName, DeviceTypeKind.Reference);
    }

    private string BaseTypeName(EntityHandle baseType)
    {
        switch (baseType.Kind)
        {
            case HandleKind.TypeDefinition:
                return FullName((TypeDefinitionHandle)baseType);
            case HandleKind.TypeReference:
                TypeReference r = Reader.GetTypeReference((TypeReferenceHandle)baseType);
                return Reader.GetString(r.Namespace) + "." + Reader.GetString(r.Name);
            default:
                return ""; // a generic base class: a class
        }
    }

    private DeviceType ClassifyReference(TypeReferenceHandle handle)
    {
        string key = ReferenceKey(handle, out EntityHandle scope);
        if (scope.Kind == HandleKind.ModuleDefinition || scope.Kind == HandleKind.ModuleReference)
        {
            return Classify(Lookup(this, key, handle));
        }

        if (scope.Kind != HandleKind.AssemblyReference)
        {
            throw new InvalidDataException(Name + ": type reference " + key + " has an unexpected resolution scope " + scope.Kind);
        }

        string assembly = Reader.GetString(Reader.GetAssemblyReference((AssemblyReferenceHandle)scope).Name);
        if (references.TryGetValue(assembly, out DeviceModule? referenced))
        {
            return referenced.Classify(Lookup(referenced, key, handle));
        }

        if (assembly != "mscorlib" || corlib == null)
        {
            throw new InvalidDataException(Name + ": type " + key + " comes from " + assembly + "; only mscorlib and the assemblies given as references can be resolved");
        }

        return corlib.Classify(Lookup(corlib, key, handle));
    }

    private TypeDefinitionHandle Lookup(DeviceModule target, string key, TypeReferenceHandle from)
    {
        if (!target.typesByFullName.TryGetValue(key, out TypeDefinitionHandle def))
        {
            throw new InvalidDataException(Name + ": type " + key + " (reference 0x" + MetadataTokens.GetToken(from).ToString("X8") + ") is not defined in " + target.Name);
        }

        return def;
    }

    // "Namespace.Name", nested as "Namespace.Outer/Inner"; scope is the outermost resolution scope.
    private string ReferenceKey(TypeReferenceHandle handle, out EntityHandle scope)
    {
        TypeReference r = Reader.GetTypeReference(handle);
        if (r.ResolutionScope.Kind == HandleKind.TypeReference)
        {
            return ReferenceKey((TypeReferenceHandle)r.ResolutionScope, out scope) + "/" + Reader.GetString(r.Name);
        }

        scope = r.ResolutionScope;
        string ns = Reader.GetString(r.Namespace);
        return (ns.Length > 0 ? ns + "." : "") + Reader.GetString(r.Name);
    }

    private string FullName(TypeDefinitionHandle handle)
    {
        TypeDefinition t = Reader.GetTypeDefinition(handle);
        TypeDefinitionHandle outer = t.GetDeclaringType();
        if (!outer.IsNil)
        {
            return FullName(outer) + "/" + Reader.GetString(t.Name);
        }

        string ns = Reader.GetString(t.Namespace);
        return (ns.Length > 0 ? ns + "." : "") + Reader.GetString(t.Name);
    }

    private string ShortName(TypeDefinitionHandle handle)
    {
        TypeDefinition t = Reader.GetTypeDefinition(handle);
        TypeDefinitionHandle outer = t.GetDeclaringType();
        string name = Reader.GetString(t.Name);
        if (PrimitiveNames.TryGetValue(FullName(handle), out string? primitive))
        {
            return primitive;
        }

        return outer.IsNil ? name : ShortName(outer) + "." + name;
    }
}
