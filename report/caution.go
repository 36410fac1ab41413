package report

// Caution is printed with every report.
const Caution = "These figures are model estimates, not a reserves or resources statement. " +
	"Public reporting requires a competent or qualified person under the applicable reporting code; " +
	"drilling, stimulation and plant design follow local codes and licensed practice."

// Convention states the percentile convention, printed with every report.
const Convention = "P90, P50 and P10 are exceedance values: P90 (low estimate) is exceeded by 90% of trials, " +
	"i.e. it is the 10th percentile; P10 (high estimate) is the 90th percentile. " +
	"Percentiles interpolate linearly between order statistics (Hyndman & Fan 1996, type 7)."
