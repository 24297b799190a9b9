using System.Reflection.Metadata;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>One decoded IL instruction of a method body.</summary>
internal sealed class IlInstruction
{
    public IlInstruction(int offset, ILOpCode opCode, int size, int token, int[] branchTargets)
    {
        Offset = offset;
        OpCode = opCode;
        Size = size;
        Token = token;
        BranchTargets = branchTargets;
    }

    /// <summary>Byte offset of the opcode in the body.</summary>
    public int Offset { get; }

    public ILOpCode OpCode { get; }

    /// <summary>Opcode plus operand, bytes.</summary>
    public int Size { get; }

    /// <summary>Offset of the next instruction.</summary>
    public int End => Offset + Size;

    /// <summary>Metadata token operand (call, newobj, initobj, ldfld...); 0 for other operands.</summary>
    public int Token { get; }

    /// <summary>Absolute offsets this instruction may branch to (branch, leave, switch); empty otherwise.</summary>
    public int[] BranchTargets { get; }
}
