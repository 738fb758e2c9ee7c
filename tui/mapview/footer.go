package mapview

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"isofield/interp/contour"
)

// ScaleBar returns a north arrow and a scale bar for v that fit in width
// cells, for example "N↑  |-----| 20 m". The bar's length is a round
// distance (1, 2 or 5 × 10ⁿ metres) no longer than a quarter of the view.
func ScaleBar(v View, width int) string {
	if !(v.MPC > 0) || width < 8 {
		return ""
	}
	room := min(v.Width/4, width-12)
	if room < 2 {
		return "N↑"
	}
	d := contour.FloorNice(float64(room) * v.MPC)
	n := max(int(math.Round(d/v.MPC)), 2)
	bar := "|" + strings.Repeat("-", n-2) + "|"
	return fmt.Sprintf("N↑  %s %s", bar, Distance(d))
}

// Distance formats metres for a scale bar: "500 mm", "20 m", "2 km".
func Distance(m float64) string {
	switch {
	case m >= 1000:
		return strconv.FormatFloat(m/1000, 'g', 4, 64) + " km"
	case m >= 1:
		return strconv.FormatFloat(m, 'g', 4, 64) + " m"
	}
	return strconv.FormatFloat(m*1000, 'g', 4, 64) + " mm"
}
