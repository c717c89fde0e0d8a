using LoopShaper.Core.PlantModels;

namespace LoopShaper.Web.Model;

/// <summary>The inputs of one output capacitor branch (count identical parts in parallel).</summary>
public sealed class CapacitorBranchForm
{
    /// <summary>A branch form at position <paramref name="index"/> of the bank.</summary>
    public CapacitorBranchForm(int index, CapacitorBranch branch)
    {
        Label = branch.Label;
        Count = new FieldState(string.Empty, "Parts in parallel", string.Empty, branch.Count, "pcs", wholeNumber: true);
        Capacitance = new FieldState(string.Empty, "Capacitance, each", "F", branch.CapacitanceF);
        Esr = new FieldState(string.Empty, "ESR, each", "Ohm", branch.EsrOhm, "Ω");
        Esl = new FieldState(string.Empty, "ESL, each", "H", branch.EslH);
        Reindex(index);
    }

    /// <summary>What the engineer calls the branch.</summary>
    public string Label { get; set; }

    /// <summary>Parts in parallel.</summary>
    public FieldState Count { get; }

    /// <summary>Capacitance of one part.</summary>
    public FieldState Capacitance { get; }

    /// <summary>ESR of one part.</summary>
    public FieldState Esr { get; }

    /// <summary>ESL of one part.</summary>
    public FieldState Esl { get; }

    /// <summary>JSON path prefix of this branch.</summary>
    public string Path { get; private set; } = string.Empty;

    /// <summary>Every field of the branch.</summary>
    public IEnumerable<FieldState> Fields => [Count, Capacitance, Esr, Esl];

    /// <summary>Moves the branch to a new position in the bank (after a removal) and renames its field paths.</summary>
    public void Reindex(int index)
    {
        Path = $"plant.powerStage.outputCapacitors[{index}]";
        Count.Path = Path + ".count";
        Capacitance.Path = Path + ".capacitanceF";
        Esr.Path = Path + ".esrOhm";
        Esl.Path = Path + ".eslH";
    }

    /// <summary>The branch from the last readable values.</summary>
    public CapacitorBranch Build() => new(Label, (int)(Count.Value ?? 1), Capacitance.Value ?? double.NaN, Esr.Value ?? double.NaN, Esl.Value ?? 0.0);
}
