namespace FreqReadout.Host.Planning;

/// <summary>The estimator names <c>plan</c> prints: the same words as <c>count --json</c>'s <c>estimator</c>.</summary>
public static class PlanEstimators
{
    /// <summary>First and last edge of the gate.</summary>
    public const string Reciprocal = "reciprocal";

    /// <summary>Least-squares slope over every edge of the gate.</summary>
    public const string Regression = "regression";

    /// <summary>Least-squares slope of count against time over the pulse-counter reads of the gate.</summary>
    public const string SnapshotRegression = "snapshot-regression";
}
