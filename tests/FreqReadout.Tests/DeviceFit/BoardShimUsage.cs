using System.Reflection;
using System.Reflection.Metadata;
using System.Reflection.PortableExecutable;
using System.Text.RegularExpressions;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// Compares the compile-only shim (firmware/BoardShim) with what the board assembly (firmware/Board) really uses, so
/// the shim cannot grow into a fake runtime: every public type of the shim must be referenced by the board assembly's
/// metadata, every public method, constructor and field must appear among its member references (same name and
/// signature), every property must have an accessor referenced, and every enum value must be named in the board
/// sources as <c>Type.Value</c> (the compiler inlines enum values, so metadata cannot show them). Delegates are
/// checked as types only.
/// </summary>
internal static class BoardShimUsage
{
    /// <summary>The shim members the board does not use, one line each; empty when the shim is exactly what the board needs.</summary>
    public static IReadOnlyList<string> FindUnused(byte[] shimImage, byte[] boardImage, string boardSources)
    {
        using var shimPe = new PEReader(new MemoryStream(shimImage));
        using var boardPe = new PEReader(new MemoryStream(boardImage));
        MetadataReader shim = shimPe.GetMetadataReader();
        MetadataReader board = boardPe.GetMetadataReader();
        string shimName = shim.GetString(shim.GetAssemblyDefinition().Name);
        (HashSet<string> types, HashSet<string> members) = BoardReferences(board, shimName);

        var unused = new List<string>();
        foreach (TypeDefinitionHandle th in shim.TypeDefinitions)
        {
            TypeDefinition type = shim.GetTypeDefinition(th);
            if ((type.Attributes & TypeAttributes.VisibilityMask) != TypeAttributes.Public)
            {
                continue;
            }

            string typeName = MetadataSignatureText.TypeName(shim, th);
            if (!types.Contains(typeName))
            {
                unused.Add("type " + typeName + " is not referenced by the board assembly");
                continue;
            }

            string baseName = BaseTypeName(shim, type);
            if (baseName == "System.MulticastDelegate")
            {
                continue;
            }

            if (baseName == "System.Enum")
            {
                string shortName = shim.GetString(type.Name);
                foreach (FieldDefinitionHandle fh in type.GetFields())
                {
                    FieldDefinition field = shim.GetFieldDefinition(fh);
                    string literal = shim.GetString(field.Name);
                    if ((field.Attributes & FieldAttributes.Literal) != 0
                        && !Regex.IsMatch(boardSources, @"\b" + Regex.Escape(shortName + "." + literal) + @"\b"))
                    {
                        unused.Add("enum value " + typeName + "." + literal + " is not named in the board sources");
                    }
                }

                continue;
            }

            var accessors = new Dictionary<MethodDefinitionHandle, string>();
            var propertyUsed = new Dictionary<string, bool>();
            foreach (PropertyDefinitionHandle ph in type.GetProperties())
            {
                PropertyDefinition property = shim.GetPropertyDefinition(ph);
                string propertyName = shim.GetString(property.Name);
                PropertyAccessors a = property.GetAccessors();
                propertyUsed[propertyName] = false;
                if (!a.Getter.IsNil)
                {
                    accessors[a.Getter] = propertyName;
                }

                if (!a.Setter.IsNil)
                {
                    accessors[a.Setter] = propertyName;
                }
            }

            foreach (MethodDefinitionHandle mh in type.GetMethods())
            {
                MethodDefinition method = shim.GetMethodDefinition(mh);
                if ((method.Attributes & MethodAttributes.MemberAccessMask) != MethodAttributes.Public)
                {
                    continue;
                }

                string key = typeName + "::" + shim.GetString(method.Name) + " " + MetadataSignatureText.Method(method.DecodeSignature(MetadataSignatureText.Instance, null));
                bool referenced = members.Contains(key);
                if (accessors.TryGetValue(mh, out string? propertyName))
                {
                    propertyUsed[propertyName] |= referenced;
                }
                else if (!referenced)
                {
                    unused.Add("method " + key + " is not called by the board assembly");
                }
            }

            foreach (KeyValuePair<string, bool> p in propertyUsed.Where(p => !p.Value))
            {
                unused.Add("property " + typeName + "::" + p.Key + " is not used by the board assembly");
            }

            foreach (FieldDefinitionHandle fh in type.GetFields())
            {
                FieldDefinition field = shim.GetFieldDefinition(fh);
                if ((field.Attributes & FieldAttributes.FieldAccessMask) != FieldAttributes.Public)
                {
                    continue;
                }

                string key = typeName + "::" + shim.GetString(field.Name) + " " + field.DecodeSignature(MetadataSignatureText.Instance, null);
                if (!members.Contains(key))
                {
                    unused.Add("field " + key + " is not used by the board assembly");
                }
            }
        }

        return unused;
    }

    /// <summary>Methods of the shim whose body is anything but "throw new NotImplementedException(...)".</summary>
    public static IReadOnlyList<string> FindBodiesThatDoMoreThanThrow(byte[] shimImage)
    {
        using var pe = new PEReader(new MemoryStream(shimImage));
        MetadataReader md = pe.GetMetadataReader();
        var offenders = new List<string>();
        foreach (TypeDefinitionHandle th in md.TypeDefinitions)
        {
            TypeDefinition type = md.GetTypeDefinition(th);
            if (IsEmbeddedByCompiler(md, type))
            {
                // Attribute types the compiler adds to any assembly (IsReadOnlyAttribute, RefSafetyRulesAttribute ...).
                continue;
            }

            foreach (MethodDefinitionHandle mh in type.GetMethods())
            {
                MethodDefinition method = md.GetMethodDefinition(mh);
                string name = MetadataSignatureText.TypeName(md, th) + "::" + md.GetString(method.Name);
                if (method.RelativeVirtualAddress == 0)
                {
                    continue;
                }

                byte[] il = pe.GetMethodBody(method.RelativeVirtualAddress).GetILBytes()!;
                IReadOnlyList<IlInstruction> code = IlDecoder.Decode(il, name);
                bool isPrivateConstructor = md.GetString(method.Name) == ".ctor"
                    && (method.Attributes & MethodAttributes.MemberAccessMask) != MethodAttributes.Public;
                if (isPrivateConstructor && code.All(i => i.OpCode is ILOpCode.Ldarg_0 or ILOpCode.Call or ILOpCode.Nop or ILOpCode.Ret))
                {
                    // A hidden constructor that only calls object's: it keeps the compiler from adding a public one.
                    continue;
                }

                bool throwsNotImplemented = code.Count > 0 && code[^1].OpCode == ILOpCode.Throw
                    && code.Any(i => i.OpCode == ILOpCode.Newobj && CalledTypeName(md, i.Token) == "System.NotImplementedException")
                    && code.All(i => i.OpCode is ILOpCode.Ldstr or ILOpCode.Newobj or ILOpCode.Throw or ILOpCode.Nop or ILOpCode.Ldarg_0 or ILOpCode.Call);
                bool callsOnlyBaseConstructor = code.Where(i => i.OpCode == ILOpCode.Call).All(i => CalledTypeName(md, i.Token) == "System.Object");
                if (!throwsNotImplemented || !callsOnlyBaseConstructor)
                {
                    offenders.Add(name + ": " + string.Join(" ", code.Select(i => i.OpCode)));
                }
            }
        }

        return offenders;
    }

    private static (HashSet<string> Types, HashSet<string> Members) BoardReferences(MetadataReader board, string shimName)
    {
        var types = new HashSet<string>();
        foreach (TypeReferenceHandle th in board.TypeReferences)
        {
            if (IsFrom(board, th, shimName))
            {
                types.Add(MetadataSignatureText.TypeName(board, th));
            }
        }

        var members = new HashSet<string>();
        foreach (MemberReferenceHandle mh in board.MemberReferences)
        {
            MemberReference member = board.GetMemberReference(mh);
            if (member.Parent.Kind != HandleKind.TypeReference || !IsFrom(board, (TypeReferenceHandle)member.Parent, shimName))
            {
                continue;
            }

            string signature = member.GetKind() == MemberReferenceKind.Method
                ? MetadataSignatureText.Method(member.DecodeMethodSignature(MetadataSignatureText.Instance, null))
                : member.DecodeFieldSignature(MetadataSignatureText.Instance, null);
            members.Add(MetadataSignatureText.TypeName(board, (TypeReferenceHandle)member.Parent) + "::" + board.GetString(member.Name) + " " + signature);
        }

        return (types, members);
    }

    private static bool IsEmbeddedByCompiler(MetadataReader md, TypeDefinition type)
    {
        foreach (CustomAttributeHandle ah in type.GetCustomAttributes())
        {
            if (CalledTypeName(md, System.Reflection.Metadata.Ecma335.MetadataTokens.GetToken(md.GetCustomAttribute(ah).Constructor)) == "Microsoft.CodeAnalysis.EmbeddedAttribute")
            {
                return true;
            }
        }

        return false;
    }

    private static bool IsFrom(MetadataReader md, TypeReferenceHandle handle, string assemblyName)
    {
        EntityHandle scope = md.GetTypeReference(handle).ResolutionScope;
        while (scope.Kind == HandleKind.TypeReference)
        {
            scope = md.GetTypeReference((TypeReferenceHandle)scope).ResolutionScope;
        }

        return scope.Kind == HandleKind.AssemblyReference
            && md.GetString(md.GetAssemblyReference((AssemblyReferenceHandle)scope).Name) == assemblyName;
    }

    private static string BaseTypeName(MetadataReader md, TypeDefinition type)
    {
        EntityHandle b = type.BaseType;
        return b.Kind switch
        {
            HandleKind.TypeReference => MetadataSignatureText.TypeName(md, (TypeReferenceHandle)b),
            HandleKind.TypeDefinition => MetadataSignatureText.TypeName(md, (TypeDefinitionHandle)b),
            _ => string.Empty,
        };
    }

    private static string CalledTypeName(MetadataReader md, int token)
    {
        EntityHandle handle = System.Reflection.Metadata.Ecma335.MetadataTokens.EntityHandle(token);
        EntityHandle parent = handle.Kind switch
        {
            HandleKind.MemberReference => md.GetMemberReference((MemberReferenceHandle)handle).Parent,
            HandleKind.MethodDefinition => md.GetMethodDefinition((MethodDefinitionHandle)handle).GetDeclaringType(),
            _ => default,
        };
        return parent.Kind switch
        {
            HandleKind.TypeReference => MetadataSignatureText.TypeName(md, (TypeReferenceHandle)parent),
            HandleKind.TypeDefinition => MetadataSignatureText.TypeName(md, (TypeDefinitionHandle)parent),
            _ => string.Empty,
        };
    }
}
