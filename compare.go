package rockheat

import (
	"rockheat/heatmodel"
)

// CompareDeclines runs a hot-rock run whose decline is the fracture model
// twice, with the fracture drawdown and with the exponential decline of a
// well-mixed block, on the same draws of the inputs they share, and
// returns the fracture result with the exponential one as its
// Comparison: the two declines on one report. Both runs draw the same
// values of every input (the exponential run draws the fracture inputs it
// does not use).
func CompareDeclines(rn *Run, opt Options) (*Result, error) {
	h, ok := rn.Model.(*HotRock)
	if !ok || h.Decline != heatmodel.DeclineFractures {
		return nil, &OptionError{Msg: "comparing declines needs a hot-rock scenario with the fracture decline and its fracture inputs (decline = \"fractures\")"}
	}
	res, err := Estimate(rn, opt)
	if err != nil {
		return nil, err
	}
	exp := *h
	exp.Decline, exp.drawFractures = heatmodel.DeclineExponential, true
	alt := *rn
	alt.Model = &exp
	opt.Progress = nil
	if res.Comparison, err = Estimate(&alt, opt); err != nil {
		return nil, err
	}
	return res, nil
}
