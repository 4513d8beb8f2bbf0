// A characteristic-strain spectrum on a frequency grid (observed GW frequency, Hz).
export interface Spectrum {
  frequencyHz: Float64Array;
  /** Characteristic strain h_c at each frequency (dimensionless). */
  hc: Float64Array;
}
