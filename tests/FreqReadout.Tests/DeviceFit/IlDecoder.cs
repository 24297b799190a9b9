using System.Buffers.Binary;
using System.Reflection.Metadata;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// Decodes a method body's IL bytes (ECMA-335 partition III) into instructions with a small table of
/// operand sizes; branch operands are turned into absolute target offsets.
/// </summary>
internal static class IlDecoder
{
    public static IReadOnlyList<IlInstruction> Decode(byte[] il, string methodName)
    {
        var list = new List<IlInstruction>();
        int pos = 0;
        while (pos < il.Length)
        {
            int start = pos;
            int code = il[pos++];
            if (code == 0xFE)
            {
                if (pos >= il.Length)
                {
                    throw new InvalidDataException(methodName + ": IL offset " + start + ": two-byte opcode cut short");
                }

                code = 0xFE00 | il[pos++];
            }

            var op = (ILOpCode)code;
            int token = 0;
            int[] targets = [];
            if (op == ILOpCode.Switch)
            {
                int n = ReadInt32(il, ref pos, methodName, start);
                int baseOffset = pos + (4 * n);
                targets = new int[n];
                for (int i = 0; i < n; i++)
                {
                    targets[i] = baseOffset + ReadInt32(il, ref pos, methodName, start);
                }
            }
            else if (op.IsBranch())
            {
                int size = op.GetBranchOperandSize();
                int delta = size == 1 ? (sbyte)ReadBytes(il, ref pos, 1, methodName, start)[0] : ReadInt32(il, ref pos, methodName, start);
                targets = [pos + delta];
            }
            else
            {
                int size = OperandSize(op, methodName, start);
                if (size == TokenOperand)
                {
                    token = ReadInt32(il, ref pos, methodName, start);
                }
                else
                {
                    ReadBytes(il, ref pos, size, methodName, start);
                }
            }

            list.Add(new IlInstruction(start, op, pos - start, token, targets));
        }

        return list;
    }

    private const int TokenOperand = -4;

    // Operand bytes of every non-branch opcode; TokenOperand for a 4-byte metadata token.
    private static int OperandSize(ILOpCode op, string methodName, int offset)
    {
        switch (op)
        {
            case ILOpCode.Ldarg_s:
            case ILOpCode.Ldarga_s:
            case ILOpCode.Starg_s:
            case ILOpCode.Ldloc_s:
            case ILOpCode.Ldloca_s:
            case ILOpCode.Stloc_s:
            case ILOpCode.Ldc_i4_s:
            case ILOpCode.Unaligned:
                return 1;
            case ILOpCode.Ldarg:
            case ILOpCode.Ldarga:
            case ILOpCode.Starg:
            case ILOpCode.Ldloc:
            case ILOpCode.Ldloca:
            case ILOpCode.Stloc:
                return 2;
            case ILOpCode.Ldc_i4:
            case ILOpCode.Ldc_r4:
                return 4;
            case ILOpCode.Ldc_i8:
            case ILOpCode.Ldc_r8:
                return 8;
            case ILOpCode.Jmp:
            case ILOpCode.Call:
            case ILOpCode.Calli:
            case ILOpCode.Callvirt:
            case ILOpCode.Cpobj:
            case ILOpCode.Ldobj:
            case ILOpCode.Ldstr:
            case ILOpCode.Newobj:
            case ILOpCode.Castclass:
            case ILOpCode.Isinst:
            case ILOpCode.Unbox:
            case ILOpCode.Ldfld:
            case ILOpCode.Ldflda:
            case ILOpCode.Stfld:
            case ILOpCode.Ldsfld:
            case ILOpCode.Ldsflda:
            case ILOpCode.Stsfld:
            case ILOpCode.Stobj:
            case ILOpCode.Box:
            case ILOpCode.Newarr:
            case ILOpCode.Ldelema:
            case ILOpCode.Ldelem:
            case ILOpCode.Stelem:
            case ILOpCode.Unbox_any:
            case ILOpCode.Refanyval:
            case ILOpCode.Mkrefany:
            case ILOpCode.Ldtoken:
            case ILOpCode.Ldftn:
            case ILOpCode.Ldvirtftn:
            case ILOpCode.Initobj:
            case ILOpCode.Constrained:
            case ILOpCode.Sizeof:
                return TokenOperand;
        }

        if (!Enum.IsDefined(op))
        {
            throw new InvalidDataException(methodName + ": IL offset " + offset + ": unknown opcode 0x" + ((int)op).ToString("X"));
        }

        return 0;
    }

    private static int ReadInt32(byte[] il, ref int pos, string methodName, int offset)
    {
        return BinaryPrimitives.ReadInt32LittleEndian(ReadBytes(il, ref pos, 4, methodName, offset));
    }

    private static byte[] ReadBytes(byte[] il, ref int pos, int count, string methodName, int offset)
    {
        if (pos + count > il.Length)
        {
            throw new InvalidDataException(methodName + ": IL offset " + offset + ": operand of " + count + " bytes runs past the end of the body");
        }

        byte[] bytes = il.AsSpan(pos, count).ToArray();
        pos += count;
        return bytes;
    }
}
