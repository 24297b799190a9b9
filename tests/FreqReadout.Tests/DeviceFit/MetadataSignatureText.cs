using System.Collections.Immutable;
using System.Reflection.Metadata;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// Writes a signature's types as text ("System.Int32", "System.Device.Gpio.PinMode", "System.Byte[]") so that a
/// member defined in one assembly (type definitions) and a reference to it from another (type references) compare
/// equal when they name the same types.
/// </summary>
internal sealed class MetadataSignatureText : ISignatureTypeProvider<string, object?>
{
    public static readonly MetadataSignatureText Instance = new();

    public static string TypeName(MetadataReader md, TypeDefinitionHandle handle)
    {
        TypeDefinition t = md.GetTypeDefinition(handle);
        string name = md.GetString(t.Name);
        TypeDefinitionHandle declaring = t.GetDeclaringType();
        return declaring.IsNil ? Join(md.GetString(t.Namespace), name) : TypeName(md, declaring) + "+" + name;
    }

    public static string TypeName(MetadataReader md, TypeReferenceHandle handle)
    {
        TypeReference t = md.GetTypeReference(handle);
        string name = md.GetString(t.Name);
        return t.ResolutionScope.Kind == HandleKind.TypeReference
            ? TypeName(md, (TypeReferenceHandle)t.ResolutionScope) + "+" + name
            : Join(md.GetString(t.Namespace), name);
    }

    public static string Method(MethodSignature<string> signature)
    {
        return signature.ReturnType + "(" + string.Join(",", signature.ParameterTypes) + ")";
    }

    public string GetPrimitiveType(PrimitiveTypeCode typeCode) => "System." + typeCode;

    public string GetTypeFromDefinition(MetadataReader reader, TypeDefinitionHandle handle, byte rawTypeKind) => TypeName(reader, handle);

    public string GetTypeFromReference(MetadataReader reader, TypeReferenceHandle handle, byte rawTypeKind) => TypeName(reader, handle);

    public string GetTypeFromSpecification(MetadataReader reader, object? genericContext, TypeSpecificationHandle handle, byte rawTypeKind)
        => reader.GetTypeSpecification(handle).DecodeSignature(this, genericContext);

    public string GetSZArrayType(string elementType) => elementType + "[]";

    public string GetArrayType(string elementType, ArrayShape shape) => elementType + "[" + new string(',', shape.Rank - 1) + "]";

    public string GetByReferenceType(string elementType) => elementType + "&";

    public string GetPointerType(string elementType) => elementType + "*";

    public string GetPinnedType(string elementType) => elementType + " pinned";

    public string GetModifiedType(string modifier, string unmodifiedType, bool isRequired) => unmodifiedType;

    public string GetGenericInstantiation(string genericType, ImmutableArray<string> typeArguments) => genericType + "<" + string.Join(",", typeArguments) + ">";

    public string GetGenericMethodParameter(object? genericContext, int index) => "!!" + index;

    public string GetGenericTypeParameter(object? genericContext, int index) => "!" + index;

    public string GetFunctionPointerType(MethodSignature<string> signature) => "method " + Method(signature);

    private static string Join(string ns, string name) => ns.Length == 0 ? name : ns + "." + name;
}
