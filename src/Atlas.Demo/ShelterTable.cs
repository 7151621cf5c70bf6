namespace Atlas.Demo;

/// <summary>
/// How much of an incoming swell reaches each wet cell, for every mean direction and two
/// directional spreads. A direction sector passes a fraction of its energy that grows with the
/// open water in front of the cell: nothing when land is right there, all of it when the ray reaches
/// the ocean; the energy of a sea state is spread over sectors with a wrapped Gaussian of its
/// spread. The table stores, per cell, mean direction and spread class, the passed energy
/// fraction, the turn of the mean direction (energy from blocked sectors is gone), and the change
/// of the spread. Between spread classes and direction bins the values are interpolated.
/// </summary>
public sealed class ShelterTable
{
    /// <summary>Spreads (degrees) at which the table is evaluated; others interpolate, and clamp outside.</summary>
    public static readonly double[] SpreadClassesDegrees = [15.0, 35.0];

    /// <summary>
    /// E-folding open-water distance of a blocked sector, km: energy from a direction blocked far
    /// away has partly regrown or wrapped round the obstacle, from one blocked close by it has not.
    /// </summary>
    public const double RecoveryDistanceKm = 150.0;

    /// <summary>Smallest energy fraction any direction passes (diffraction round obstacles).</summary>
    public const double DiffractionFloor = 0.01;

    private const int Bins = FetchRays.SectorCount;
    private const int Classes = 2;
    private const int Stride = Bins * Classes;

    // Interleaved per entry: energy fraction, turn (degrees), spread ratio; entries ordered by
    // cell, spread class, direction bin, so one look touches four neighbouring triples.
    private readonly float[] _table;
    private readonly double[] _openWaterFrom;

    /// <summary>Builds the table for every wet cell of the fetch rays.</summary>
    public ShelterTable(FetchRays rays, int wetCount)
    {
        _table = new float[wetCount * Stride * 3];
        _openWaterFrom = new double[wetCount];
        var sinOffset = new double[Bins];
        var cosOffset = new double[Bins];
        for (int s = 0; s < Bins; s++) { sinOffset[s] = Math.Sin(Offset(s)); cosOffset[s] = Math.Cos(Offset(s)); }
        var weights = new double[Classes][];
        var openResultant = new double[Classes];
        for (int c = 0; c < Classes; c++)
        {
            weights[c] = SectorWeights(SpreadClassesDegrees[c]);
            double sum = 0;
            for (int s = 0; s < Bins; s++) sum += weights[c][s] * cosOffset[s];
            openResultant[c] = sum;
        }

        Parallel.For(0, wetCount, k =>
        {
            Span<double> passed = stackalloc double[Bins];
            double openEast = 0, openNorth = 0;
            for (int s = 0; s < Bins; s++)
            {
                passed[s] = PassedFraction(rays.DistanceKm(k, s));
                double azimuth = s * FetchRays.SectorDegrees * Math.PI / 180.0;
                openEast += passed[s] * Math.Sin(azimuth);
                openNorth += passed[s] * Math.Cos(azimuth);
            }
            double open = Math.Atan2(openEast, openNorth) * 180.0 / Math.PI;
            _openWaterFrom[k] = open < 0 ? open + 360.0 : open;
            for (int c = 0; c < Classes; c++)
            {
                double[] w = weights[c];
                double openSpread = SeaStateMix.SpreadFromResultant(openResultant[c]);
                for (int b = 0; b < Bins; b++)
                {
                    double energy = 0, sx = 0, sy = 0;
                    for (int s = 0; s < Bins; s++)
                    {
                        int sector = (b + s - Bins / 2 + Bins) % Bins;
                        double e = w[s] * passed[sector];
                        energy += e;
                        sx += e * sinOffset[s];
                        sy += e * cosOffset[s];
                    }
                    int at = 3 * (k * Stride + c * Bins + b);
                    _table[at] = (float)energy;
                    _table[at + 1] = (float)(Math.Atan2(sx, sy) * 180.0 / Math.PI);
                    double resultant = Math.Sqrt(sx * sx + sy * sy) / energy;
                    _table[at + 2] = (float)(SeaStateMix.SpreadFromResultant(resultant) / openSpread);
                }
            }
        });
    }

    /// <summary>
    /// The passed energy fraction, the turn of the mean direction (degrees, positive clockwise)
    /// and the spread ratio for wet cell k and a swell from <paramref name="fromDegrees"/> with
    /// directional spread <paramref name="spreadDegrees"/>.
    /// </summary>
    public (double EnergyFraction, double TurnDegrees, double SpreadRatio) Look(int k, double fromDegrees, double spreadDegrees)
    {
        double f = FetchRays.SectorsAround(fromDegrees, out int b0, out int b1);
        double g = Math.Clamp((spreadDegrees - SpreadClassesDegrees[0]) / (SpreadClassesDegrees[1] - SpreadClassesDegrees[0]), 0.0, 1.0);
        int n0 = 3 * (k * Stride + b0), n1 = 3 * (k * Stride + b1);
        int w0 = n0 + 3 * Bins, w1 = n1 + 3 * Bins;
        var t = _table;
        double Blend(int q)
        {
            double narrow = t[n0 + q] + f * (t[n1 + q] - t[n0 + q]);
            double wide = t[w0 + q] + f * (t[w1 + q] - t[w0 + q]);
            return narrow + g * (wide - narrow);
        }
        return (Blend(0), Blend(1), Blend(2));
    }

    /// <summary>
    /// The energy fraction a direction sector passes when land lies <paramref name="distanceKm"/>
    /// away along it: 1 for open ocean, otherwise 1 - exp(-d / <see cref="RecoveryDistanceKm"/>),
    /// never below <see cref="DiffractionFloor"/>.
    /// </summary>
    public static double PassedFraction(double distanceKm) =>
        distanceKm >= FetchRays.OpenOceanKm
            ? 1.0
            : Math.Max(DiffractionFloor, 1.0 - Math.Exp(-distanceKm / RecoveryDistanceKm));

    /// <summary>
    /// The direction (degrees true, coming from) of the open water in front of wet cell k: the
    /// mean of all directions weighted by the energy each passes. Deep water lies that way, so it
    /// stands for the normal of the depth contours that refract the swell, also in channels and
    /// bays where the nearest shore would point the wrong way.
    /// </summary>
    public double OpenWaterFromDegrees(int k) => _openWaterFrom[k];

    private static double Offset(int s) => (s - Bins / 2) * FetchRays.SectorDegrees * Math.PI / 180.0;

    private static double[] SectorWeights(double spreadDegrees)
    {
        var w = new double[Bins];
        double sigma = spreadDegrees * Math.PI / 180.0, sum = 0;
        for (int s = 0; s < Bins; s++)
        {
            double o = Offset(s);
            w[s] = Math.Exp(-0.5 * o * o / (sigma * sigma));
            sum += w[s];
        }
        for (int s = 0; s < Bins; s++) w[s] /= sum;
        return w;
    }

}
