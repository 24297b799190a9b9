using System.Reflection.Metadata;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// Finds every method other than a constructor (.ctor, .cctor) that declares a local of a
/// non-primitive, non-enum value type (decoded from the local signature blob) or creates one:
/// <c>newobj</c> of a value type's constructor, <c>initobj</c> of a value type, or a call of a value
/// type's constructor on an address (construction in place, as C# compiles <c>s = new S(...)</c> for
/// a local). nanoCLR keeps each of those on the heap.
/// </summary>
internal static class StructSiteChecker
{
    public static IReadOnlyList<StructSite> Find(DeviceModule module)
    {
        var sites = new List<StructSite>();
        foreach (MethodDefinitionHandle method in module.Methods())
        {
            if (module.IsConstructor(method))
            {
                continue;
            }

            string name = module.MethodName(method);
            var seen = new HashSet<string>();
            void Add(string what)
            {
                if (seen.Add(what))
                {
                    sites.Add(new StructSite(name, what));
                }
            }

            foreach (DeviceType local in module.Locals(method))
            {
                if (local.Kind == DeviceTypeKind.Struct)
                {
                    Add("local of type " + local.Name);
                }
            }

            foreach (IlInstruction ins in module.Instructions(method))
            {
                switch (ins.OpCode)
                {
                    case ILOpCode.Newobj:
                        DeviceType created = module.DeclaringTypeOfMethodToken(ins.Token);
                        if (created.Kind == DeviceTypeKind.Struct)
                        {
                            Add("newobj " + created.Name);
                        }

                        break;
                    case ILOpCode.Initobj:
                        DeviceType cleared = module.TypeOfToken(ins.Token);
                        if (cleared.Kind == DeviceTypeKind.Struct)
                        {
                            Add("initobj " + cleared.Name);
                        }

                        break;
                    case ILOpCode.Call:
                    case ILOpCode.Callvirt:
                        if (IsConstructorToken(module, ins.Token))
                        {
                            DeviceType built = module.DeclaringTypeOfMethodToken(ins.Token);
                            if (built.Kind == DeviceTypeKind.Struct)
                            {
                                Add("constructs " + built.Name + " in place (call .ctor)");
                            }
                        }

                        break;
                }
            }
        }

        return sites;
    }

    /// <summary>One line per offending method: "Type.Method: what; what".</summary>
    public static string Describe(IReadOnlyList<StructSite> sites)
    {
        return string.Join(Environment.NewLine, sites.GroupBy(s => s.Method).Select(g => "  " + g.Key + ": " + string.Join("; ", g.Select(s => s.What))));
    }

    private static bool IsConstructorToken(DeviceModule module, int token)
    {
        if (module.TryGetLocalMethod(token, out MethodDefinitionHandle local, out string external))
        {
            return module.IsConstructor(local);
        }

        return external.Contains("..ctor(", StringComparison.Ordinal);
    }
}
