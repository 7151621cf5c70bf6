using MathNet.Numerics;

namespace Atlas.WavePhysics;

/// <summary>
/// The directionality coefficient d = J_theta,max / J (IEC TS 62600-101): the largest power resolved in one
/// direction, i.e. crossing a line normal to it from one side, over the omnidirectional power.
/// </summary>
/// <remarks>
/// <para>
/// Per time step only a mean direction and a directional spread are known, so a spreading model is assumed:
/// the cosine-2s distribution D(phi) = C(s) cos^(2s)(phi / 2), phi measured from the mean direction, the same
/// at every frequency, with C(s) = Gamma(s + 1) / (2 sqrt(pi) Gamma(s + 1/2)). Its first circular moment is
/// s / (s + 1), so the circular spread sigma = sqrt(2 (1 - m1)) gives sigma = sqrt(2 / (s + 1)) and
/// s = 2 / sigma^2 - 1 (sigma in radians). A spread of sqrt(2) rad (81.03 degrees) or more gives s = 0, the
/// isotropic sea, d = 1/pi; a spread of 0 gives d = 1.
/// </para>
/// <para>
/// Because D is symmetric and unimodal, the resolved power is largest along the mean direction and
/// d = integral over |phi| below 90 degrees of D(phi) cos(phi) dphi = s / (s + 1) + T(s), where the tail
/// T(s) = 2 C(s) [B(1/2; s + 1/2, 1/2) - 2 B(1/2; s + 3/2, 1/2)] (incomplete beta functions) adds back the
/// energy travelling backwards, which the full first moment subtracts. <see cref="CoefficientFromSpread"/>
/// evaluates this exactly; the coefficient of a period, over many steps, comes from <see cref="DirectionalHarmonics"/>.
/// </para>
/// </remarks>
public static class Directionality
{
    /// <summary>Spread (degrees) at and above which the cosine-2s model is isotropic (s = 0): sqrt(2) rad.</summary>
    public static readonly double IsotropicSpreadDegrees = Math.Sqrt(2) * 180 / Math.PI;

    /// <summary>The cosine-2s exponent s for a circular spread (degrees): 2 / sigma^2 - 1, at least 0.</summary>
    /// <param name="spreadDegrees">Directional spread, degrees, not negative; 0 gives +infinity; NaN gives NaN.</param>
    public static double SpreadingExponentFromSpread(double spreadDegrees)
    {
        CheckSpread(spreadDegrees);
        double sigma = spreadDegrees * Math.PI / 180;
        return Math.Max(0, 2 / (sigma * sigma) - 1);
    }

    /// <summary>The circular spread (degrees) of a cosine-2s distribution with exponent s: sqrt(2 / (s + 1)).</summary>
    public static double SpreadFromSpreadingExponent(double spreadingExponent)
    {
        if (!(spreadingExponent >= 0)) throw new ArgumentOutOfRangeException(nameof(spreadingExponent), spreadingExponent, "s must not be negative.");
        return Math.Sqrt(2 / (spreadingExponent + 1)) * 180 / Math.PI;
    }

    /// <summary>D(phi) of the cosine-2s model, per radian, at phi (radians) from the mean direction.</summary>
    public static double SpreadingDensity(double angleFromMeanRadians, double spreadingExponent)
    {
        if (!(spreadingExponent >= 0)) throw new ArgumentOutOfRangeException(nameof(spreadingExponent), spreadingExponent, "s must not be negative.");
        double s = spreadingExponent;
        double c = Math.Exp(SpecialFunctions.GammaLn(s + 1) - SpecialFunctions.GammaLn(s + 0.5)) / (2 * Math.Sqrt(Math.PI));
        double half = Math.Abs(Math.Cos(angleFromMeanRadians / 2));
        return c * Math.Pow(half, 2 * s);
    }

    /// <summary>d for a step with the given directional spread under the cosine-2s model, exactly.</summary>
    /// <param name="spreadDegrees">Directional spread, degrees, not negative; NaN gives NaN.</param>
    /// <returns>d between 1/pi (spread of 81.03 degrees or more) and 1 (spread 0).</returns>
    public static double CoefficientFromSpread(double spreadDegrees)
    {
        CheckSpread(spreadDegrees);
        if (double.IsNaN(spreadDegrees)) return double.NaN;
        double sigma = spreadDegrees * Math.PI / 180;
        if (sigma * sigma >= 2) return 1 / Math.PI;
        double firstMoment = 1 - sigma * sigma / 2;
        double s = 2 / (sigma * sigma) - 1;
        // The backward tail is below 2^-s times a modest factor: nothing left to add in double precision.
        if (s > 200) return firstMoment;
        double c = Math.Exp(SpecialFunctions.GammaLn(s + 1) - SpecialFunctions.GammaLn(s + 0.5)) / (2 * Math.Sqrt(Math.PI));
        double tail = 2 * c * (SpecialFunctions.BetaIncomplete(s + 0.5, 0.5, 0.5) - 2 * SpecialFunctions.BetaIncomplete(s + 1.5, 0.5, 0.5));
        return firstMoment + tail;
    }

    /// <summary>
    /// The exact largest resolved power of a set of directional components (power travelling in one direction
    /// each), maximised over every direction: J_theta = sum P_k max(cos(theta - theta_k), 0).
    /// </summary>
    /// <param name="powers">Power of each component, not negative (any unit; the coefficient is unit-free).</param>
    /// <param name="directionsDegrees">Direction of each component, degrees (from or towards, as long as it is one convention).</param>
    /// <returns>The maximum; all NaN when there are no components or their total power is 0.</returns>
    /// <remarks>
    /// J_theta is A cos theta + B sin theta on each arc between the points theta_k +- 90 degrees, so its maximum is
    /// at one of those points or at an arc's stationary point atan2(B, A); every candidate is evaluated.
    /// The cost grows with the square of the number of components (fine for the bins of a directional spectrum).
    /// </remarks>
    public static DirectionalPower FromComponents(ReadOnlySpan<double> powers, ReadOnlySpan<double> directionsDegrees)
    {
        if (powers.Length != directionsDegrees.Length)
            throw new ArgumentException($"There are {powers.Length} powers but {directionsDegrees.Length} directions.", nameof(directionsDegrees));
        int n = powers.Length;
        double total = 0;
        for (int k = 0; k < n; k++)
        {
            if (!(powers[k] >= 0) || double.IsInfinity(powers[k]))
                throw new ArgumentException($"Component {k} has power {powers[k]}; powers must be finite and not negative.", nameof(powers));
            if (!double.IsFinite(directionsDegrees[k]))
                throw new ArgumentException($"Component {k} has direction {directionsDegrees[k]}; directions must be finite.", nameof(directionsDegrees));
            total += powers[k];
        }
        if (n == 0 || total == 0) return new DirectionalPower(total, double.NaN, double.NaN, double.NaN);

        var cos = new double[n];
        var sin = new double[n];
        var breakpoints = new double[2 * n];
        for (int k = 0; k < n; k++)
        {
            double a = directionsDegrees[k] * Math.PI / 180;
            (sin[k], cos[k]) = Math.SinCos(a);
            breakpoints[2 * k] = NormaliseRadians(a - Math.PI / 2);
            breakpoints[2 * k + 1] = NormaliseRadians(a + Math.PI / 2);
        }
        Array.Sort(breakpoints);

        double bestValue = double.NegativeInfinity, bestAngle = 0;
        void Consider(double angle, ReadOnlySpan<double> p)
        {
            var (st, ct) = Math.SinCos(angle);
            double value = 0;
            for (int k = 0; k < p.Length; k++)
            {
                double projection = ct * cos[k] + st * sin[k];
                if (projection > 0) value += p[k] * projection;
            }
            if (value > bestValue) { bestValue = value; bestAngle = angle; }
        }

        for (int b = 0; b < breakpoints.Length; b++)
        {
            double start = breakpoints[b];
            double end = b + 1 < breakpoints.Length ? breakpoints[b + 1] : breakpoints[0] + 2 * Math.PI;
            Consider(start, powers);
            if (end - start <= 0) continue;
            var (sm, cm) = Math.SinCos(0.5 * (start + end));
            double sumCos = 0, sumSin = 0;
            for (int k = 0; k < n; k++)
            {
                if (cm * cos[k] + sm * sin[k] > 0)
                {
                    sumCos += powers[k] * cos[k];
                    sumSin += powers[k] * sin[k];
                }
            }
            if (sumCos == 0 && sumSin == 0) continue;
            double stationary = Math.Atan2(sumSin, sumCos);
            double offset = NormaliseRadians(stationary - start);
            if (offset < end - start) Consider(start + offset, powers);
        }

        double direction = NormaliseRadians(bestAngle) * 180 / Math.PI;
        return new DirectionalPower(total, bestValue, direction, bestValue / total);
    }

    /// <summary>
    /// The exact directionality of a directional spectrum S(f, theta) at a depth: each direction bin's power
    /// rho g integral cg(f, h) S(f, theta) df dtheta, then <see cref="FromComponents"/>.
    /// </summary>
    /// <param name="frequencies">Frequencies, Hz, positive and increasing (trapezoidal rule in frequency).</param>
    /// <param name="directionsDegrees">Bin-centre directions, degrees, equally spaced around the whole circle (any order of start).</param>
    /// <param name="density">S(f, theta), m^2 s rad^-1, frequency-major: density[i * directions + j].</param>
    /// <param name="depthMetres">Depth, m; NaN or +infinity means deep water.</param>
    /// <returns>Powers in kW/m; coefficient NaN for an all-zero spectrum.</returns>
    public static DirectionalPower FromDirectionalSpectrum(ReadOnlySpan<double> frequencies, ReadOnlySpan<double> directionsDegrees,
        ReadOnlySpan<double> density, double depthMetres)
    {
        int nf = frequencies.Length, nd = directionsDegrees.Length;
        if (nd == 0) throw new ArgumentException("A directional spectrum needs at least one direction.", nameof(directionsDegrees));
        if (density.Length != nf * nd)
            throw new ArgumentException($"The density has {density.Length} values but {nf} frequencies x {nd} directions need {nf * nd}.", nameof(density));
        double binWidthDegrees = 360.0 / nd;
        for (int j = 1; j < nd; j++)
        {
            double step = NormaliseDegrees(directionsDegrees[j] - directionsDegrees[j - 1]);
            if (Math.Abs(step - binWidthDegrees) > 1e-6)
                throw new ArgumentException($"Directions {j - 1} and {j} are {step} degrees apart; {nd} directions must be {binWidthDegrees} degrees apart around the circle.", nameof(directionsDegrees));
        }

        var columnDensity = new double[nf];
        var powers = new double[nd];
        double binWidthRadians = binWidthDegrees * Math.PI / 180;
        var groupVelocity = new double[nf];
        for (int i = 0; i < nf; i++) groupVelocity[i] = DispersionRelation.GroupVelocity(1 / frequencies[i], depthMetres);
        for (int j = 0; j < nd; j++)
        {
            for (int i = 0; i < nf; i++) columnDensity[i] = density[i * nd + j];
            SpectralMoments.Check(frequencies, columnDensity);
            double flux = 0;
            for (int i = 1; i < nf; i++)
                flux += 0.5 * (groupVelocity[i - 1] * columnDensity[i - 1] + groupVelocity[i] * columnDensity[i]) * (frequencies[i] - frequencies[i - 1]);
            powers[j] = PhysicalConstants.SeawaterDensity * PhysicalConstants.Gravity * flux * binWidthRadians / 1000.0;
        }
        return FromComponents(powers, directionsDegrees);
    }

    private static void CheckSpread(double spreadDegrees)
    {
        if (double.IsNaN(spreadDegrees)) return;
        if (!(spreadDegrees >= 0) || double.IsInfinity(spreadDegrees))
            throw new ArgumentOutOfRangeException(nameof(spreadDegrees), spreadDegrees, "Directional spread must be finite and not negative (degrees).");
    }

    private static double NormaliseRadians(double angle)
    {
        double r = angle % (2 * Math.PI);
        return r < 0 ? r + 2 * Math.PI : r;
    }

    private static double NormaliseDegrees(double angle)
    {
        double r = angle % 360;
        return r < 0 ? r + 360 : r;
    }
}
