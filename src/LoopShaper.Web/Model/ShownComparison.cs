using System.Collections.Immutable;
using LoopShaper.Core.Design;
using LoopShaper.Library.Comparison;

namespace LoopShaper.Web.Model;

/// <summary>A comparison on screen.</summary>
/// <param name="Serial">Counts comparisons: a new chart instance for each.</param>
/// <param name="LabelA">What A is.</param>
/// <param name="LabelB">What B is.</param>
/// <param name="AnalysisA">A analysed.</param>
/// <param name="AnalysisB">B analysed.</param>
/// <param name="Inputs">The design-file fields that differ.</param>
/// <param name="Results">The headline figures of both.</param>
public sealed record ShownComparison(int Serial, string LabelA, string LabelB, DesignAnalysis AnalysisA, DesignAnalysis AnalysisB, ImmutableArray<InputDifference> Inputs, ImmutableArray<ResultFigure> Results);
