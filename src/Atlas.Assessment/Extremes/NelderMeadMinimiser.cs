using MathNet.Numerics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace Atlas.Assessment.Extremes;

/// <summary>
/// Derivative-free minimisation of a negative log-likelihood with MathNet's Nelder-Mead simplex,
/// restarted from its own result until a restart no longer improves it (a simplex can stall
/// before the true minimum, and a restart is the usual remedy).
/// </summary>
internal static class NelderMeadMinimiser
{
    private const double RelativeTolerance = 1e-13;
    private const int MaximumIterations = 20_000;
    private const int MaximumRestarts = 6;

    /// <summary>The minimising point and value. NaN from the objective counts as +∞ (outside the support).</summary>
    /// <exception cref="InvalidOperationException">The start is infeasible or the simplex does not converge.</exception>
    public static (double[] Point, double Value) Minimise(Func<double[], double> objective, double[] start, double[] initialSteps)
    {
        var function = ObjectiveFunction.Value(v =>
        {
            double value = objective(v.AsArray() ?? v.ToArray());
            return double.IsNaN(value) ? double.PositiveInfinity : value;
        });
        double[] point = start;
        double best = objective(start);
        if (!double.IsFinite(best))
            throw new InvalidOperationException("The likelihood is zero at the starting point of the fit.");
        var steps = Vector<double>.Build.DenseOfArray(initialSteps);
        for (int restart = 0; restart < MaximumRestarts; restart++)
        {
            MinimizationResult result;
            try
            {
                result = NelderMeadSimplex.Minimum(function, Vector<double>.Build.DenseOfArray(point), steps, RelativeTolerance, MaximumIterations);
            }
            catch (MaximumIterationsException exception)
            {
                throw new InvalidOperationException("The maximum-likelihood fit did not converge.", exception);
            }
            double value = result.FunctionInfoAtMinimum.Value;
            bool improved = best - value > RelativeTolerance * (1 + Math.Abs(value));
            if (value < best)
            {
                best = value;
                point = result.MinimizingPoint.ToArray();
            }
            if (!improved)
                break;
        }
        return (point, best);
    }

    /// <summary>
    /// The best of the minima reached from each start: a likelihood can have more than one local maximum, and a start
    /// from another estimator (moments, L-moments) or from the two-parameter fit guards against settling on a poor one.
    /// </summary>
    /// <exception cref="InvalidOperationException">A start is infeasible or the simplex does not converge.</exception>
    public static (double[] Point, double Value) MinimiseFromEach(Func<double[], double> objective, IReadOnlyList<double[]> starts, double[] initialSteps)
    {
        (double[] Point, double Value) best = (starts[0], double.PositiveInfinity);
        foreach (var start in starts)
        {
            var result = Minimise(objective, start, initialSteps);
            if (result.Value < best.Value)
                best = result;
        }
        return best;
    }
}
