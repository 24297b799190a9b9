using System.Collections.Immutable;
using System.Reflection.Metadata;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>Decodes signature blobs (locals, parameters, type specs) into classified <see cref="DeviceType"/>s.</summary>
internal sealed class DeviceTypeProvider : ISignatureTypeProvider<DeviceType, object?>
{
    private readonly DeviceModule module;

    public DeviceTypeProvider(DeviceModule module)
    {
        this.module = module;
    }

    public DeviceType GetPrimitiveType(PrimitiveTypeCode typeCode)
    {
        switch (typeCode)
        {
            case PrimitiveTypeCode.Boolean: return new DeviceType("bool", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.Char: return new DeviceType("char", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.SByte: return new DeviceType("sbyte", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.Byte: return new DeviceType("byte", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.Int16: return new DeviceType("short", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.UInt16: return new DeviceType("ushort", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.Int32: return new DeviceType("int", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.UInt32: return new DeviceType("uint", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.Int64: return new DeviceType("long", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.UInt64: return new DeviceType("ulong", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.Single: return new DeviceType("float", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.Double: return new DeviceType("double", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.IntPtr: return new DeviceType("IntPtr", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.UIntPtr: return new DeviceType("UIntPtr", DeviceTypeKind.Primitive);
            case PrimitiveTypeCode.String: return new DeviceType("string", DeviceTypeKind.Reference);
            case PrimitiveTypeCode.Object: return new DeviceType("object", DeviceTypeKind.Reference);
            case PrimitiveTypeCode.Void: return new DeviceType("void", DeviceTypeKind.Reference);
            case PrimitiveTypeCode.TypedReference: return new DeviceType("TypedReference", DeviceTypeKind.Struct);
            default: throw new InvalidDataException(module.Name + ": unknown primitive type code " + typeCode);
        }
    }

    public DeviceType GetTypeFromDefinition(MetadataReader reader, TypeDefinitionHandle handle, byte rawTypeKind) => module.Classify(handle);

    public DeviceType GetTypeFromReference(MetadataReader reader, TypeReferenceHandle handle, byte rawTypeKind) => module.Classify(handle);

    public DeviceType GetTypeFromSpecification(MetadataReader reader, object? genericContext, TypeSpecificationHandle handle, byte rawTypeKind) => module.Classify(handle);

    public DeviceType GetSZArrayType(DeviceType elementType) => new(elementType.Name + "[]", DeviceTypeKind.Reference);

    public DeviceType GetArrayType(DeviceType elementType, ArrayShape shape) => new(elementType.Name + "[" + new string(',', shape.Rank - 1) + "]", DeviceTypeKind.Reference);

    public DeviceType GetByReferenceType(DeviceType elementType) => new("ref " + elementType.Name, DeviceTypeKind.Pointer);

    public DeviceType GetPointerType(DeviceType elementType) => new(elementType.Name + "*", DeviceTypeKind.Pointer);

    public DeviceType GetPinnedType(DeviceType elementType) => elementType;

    public DeviceType GetModifiedType(DeviceType modifier, DeviceType unmodifiedType, bool isRequired) => unmodifiedType;

    public DeviceType GetFunctionPointerType(MethodSignature<DeviceType> signature) => new("delegate*", DeviceTypeKind.Pointer);

    public DeviceType GetGenericInstantiation(DeviceType genericType, ImmutableArray<DeviceType> typeArguments)
    {
        // A generic struct instance (Nullable<double>, a generic struct of our own) is still a struct.
        DeviceTypeKind kind = genericType.Kind == DeviceTypeKind.Primitive ? DeviceTypeKind.Struct : genericType.Kind;
        return new DeviceType(genericType.Name + "<" + string.Join(", ", typeArguments) + ">", kind);
    }

    public DeviceType GetGenericMethodParameter(object? genericContext, int index) => new("!!" + index, DeviceTypeKind.Reference);

    public DeviceType GetGenericTypeParameter(object? genericContext, int index) => new("!" + index, DeviceTypeKind.Reference);
}
