package demo

import (
	"bytes"
	"fmt"
)

// CampaignFile is the name of the campaign description Write creates.
const CampaignFile = "campaign.csv"

// CampaignTable returns the campaign description of the data set, the
// input of `tracesift survey`: header "file,device,group,bias_V,drain_V",
// then one row per spec with its Path (relative to the data set
// directory), device, condition (the group), gate bias and drain bias in
// volts with two decimals. The same device appears in both groups, so the
// comparisons can be paired by device.
func CampaignTable(specs []Spec) []byte {
	var b bytes.Buffer
	b.WriteString("file,device,group,bias_V,drain_V\n")
	for _, s := range specs {
		fmt.Fprintf(&b, "%s,%s,%s,%.2f,%.2f\n", s.Path(), s.Device, s.Condition, s.Vg, DrainBias)
	}
	return b.Bytes()
}
