package app

import (
	"fmt"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
	"finmarch/fins/validity"
	"finmarch/materials"
)

var profiles = func() []string {
	var out []string
	for _, p := range fins.Profiles {
		out = append(out, string(p))
	}
	return out
}()

func (e *env) finCmd() *cobra.Command {
	var profile, height, root, tip, dia, alloy, k, h, wall, air string
	cmd := &cobra.Command{
		Use:   "fin",
		Short: "Single-fin calculator: efficiency and heat rate of one fin",
		Long: `fin computes the efficiency and heat rate of one fin by its closed form, and checks
it with the general finite-volume fin solver. Straight profiles are per metre of
fin width; annular profiles per fin.

  finmarch fin --profile annular-tapered --height 35mm --root-thickness 4mm \
      --tip-thickness 2mm --root-diameter 90mm --alloy A356-T6 --h "60 W/m2K"`,
		Args: cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error {
			in := finInput{profile: strings.ToLower(profile)}
			var err error
			lens := []struct {
				flag string
				s    string
				dst  *float64
				need bool
			}{{"--height", height, &in.L, true}, {"--root-thickness", root, &in.t0, true}, {"--tip-thickness", tip, &in.t1, false}, {"--root-diameter", dia, &in.d, false}}
			for _, l := range lens {
				if l.s == "" {
					if l.need {
						return fail(ExitUsage, fmt.Errorf("%s is required", l.flag))
					}
					continue
				}
				if *l.dst, err = design.ParseValue[design.Length](l.s); err != nil {
					return fail(ExitUsage, fmt.Errorf("%s: %w", l.flag, err))
				}
				if !(*l.dst >= 0 && *l.dst < 1) {
					return fail(ExitUsage, fmt.Errorf("%s %s: allowed 0 to 1 m", l.flag, l.s))
				}
			}
			if tip == "" {
				in.t1 = in.t0
			}
			if h == "" {
				return fail(ExitUsage, fmt.Errorf(`--h is required (for example --h "60 W/m2K")`))
			}
			if in.h, err = design.ParseValue[design.HCoef](h); err != nil {
				return fail(ExitUsage, fmt.Errorf("--h %s: %v", h, err))
			}
			if !(in.h >= 0.1 && in.h <= 1e4) {
				return fail(ExitUsage, fmt.Errorf("--h %s: allowed 0.1 to 10000 W/m2K", h))
			}
			a, err := materials.Lookup(alloy)
			if err != nil {
				return fail(ExitUsage, fmt.Errorf("--alloy: %w", err))
			}
			in.alloy = a
			if in.tw, err = design.ParseValue[design.Temperature](wall); err != nil {
				return fail(ExitUsage, fmt.Errorf("--wall: %w", err))
			}
			if in.ta, err = design.ParseValue[design.Temperature](air); err != nil {
				return fail(ExitUsage, fmt.Errorf("--air: %w", err))
			}
			if !(in.ta > 150 && in.tw > in.ta && in.tw < 1500) {
				return fail(ExitUsage, fmt.Errorf("--wall (%s) must be above --air (%s), both absolute temperatures above 150 K", wall, air))
			}
			in.k = a.Conductivity(in.tw)
			if k != "" {
				if in.k, err = design.ParseValue[design.Conductivity](k); err != nil {
					return fail(ExitUsage, fmt.Errorf("--k %s: %v", k, err))
				}
				// the range of the custom alloys' conductivity
				if !(in.k >= 1 && in.k <= 500) {
					return fail(ExitUsage, fmt.Errorf("--k %s: allowed 1 to 500 W/mK", k))
				}
				in.kGiven = true
			}
			return e.fin(in)
		},
	}
	f := cmd.Flags()
	f.StringVar(&profile, "profile", "annular-tapered", "fin profile: "+strings.Join(profiles, ", "))
	f.StringVar(&height, "height", "", "fin height, root to tip, with unit (required)")
	f.StringVar(&root, "root-thickness", "", "thickness at the root, with unit (required)")
	f.StringVar(&tip, "tip-thickness", "", "thickness at the tip (default: the root thickness)")
	f.StringVar(&dia, "root-diameter", "", "root diameter for annular fins, with unit")
	f.StringVar(&alloy, "alloy", "A356-T6", "catalogue alloy (see 'finmarch alloys')")
	f.StringVar(&k, "k", "", "thermal conductivity instead of the alloy's, e.g. \"150 W/mK\"")
	f.StringVar(&h, "h", "", "heat-transfer coefficient, e.g. \"60 W/m2K\" (required)")
	f.StringVar(&wall, "wall", "200 C", "fin root temperature, for the heat rate")
	f.StringVar(&air, "air", "35 C", "air temperature, for the heat rate")
	complete(cmd, "profile", func() []string { return profiles })
	complete(cmd, "alloy", materials.Names)
	return cmd
}

type finInput struct {
	profile      string
	L, t0, t1, d float64
	h, k, tw, ta float64
	alloy        materials.Alloy
	kGiven       bool // --k replaced the alloy's conductivity
}

func (e *env) fin(in finInput) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	var log validity.Log
	if in.t0 <= 0 || in.L <= 0 {
		return fail(ExitUsage, fmt.Errorf("--height and --root-thickness must be positive"))
	}
	if in.t1 > in.t0 {
		return fail(ExitUsage, fmt.Errorf("--tip-thickness %s %s is thicker than the root %s %s", u.N(u.Of(output.Len, in.t1), 2), u.Name(output.Len), u.N(u.Of(output.Len, in.t0), 2), u.Name(output.Len)))
	}
	prof, err := fins.ParseProfile(in.profile)
	if err != nil {
		return fail(ExitUsage, fmt.Errorf("--%v", err))
	}
	annular := prof.Annular()
	if annular && !(in.d > 0) {
		return fail(ExitUsage, fmt.Errorf("--root-diameter is required for %s fins", in.profile))
	}
	one := fins.Single{Profile: prof, Height: in.L, RootThickness: in.t0, TipThickness: in.t1, RootRadius: in.d / 2}
	eta, area, fin := one.Efficiency(in.h, in.k, &log), one.Area(), one.Fin()
	// straight fins are per width of fin: per metre (the JSON's unit), or
	// per foot with --units us; annular fins are per fin
	per, qUnit, width := "per metre of width", output.PerWidth, 1.0
	jsonPer := per
	if u.US {
		per, width = "per foot of width", 0.3048
	}
	if annular {
		per, jsonPer, qUnit, width = "per fin", "per fin", output.Power, 1
	}
	sol, err := fins.Solve(fin, in.k, fins.Uniform(in.h), in.tw-in.ta, fins.SolveOptions{Cells: 400})
	if err != nil {
		return fail(ExitUsage, err)
	}
	dT := in.tw - in.ta
	q := eta * in.h * area * dT
	m := math.Sqrt(2 * in.h / (in.k * in.t0))
	g := output.Grid{Header: []string{"quantity", "value", "unit"}, Left: 1}
	add := func(q, v, unit string) { g.Rows = append(g.Rows, []string{q, v, unit}) }
	add("profile", in.profile, "")
	kFrom := in.alloy.Name + " at the " + fmtT(u, in.tw) + " " + u.Name(output.Temp) + " wall"
	if in.kGiven {
		kFrom = "given by --k"
	}
	add("conductivity ("+kFrom+")", u.N(u.Of(output.Cond, in.k), 1), u.Name(output.Cond))
	add("fin parameter m = sqrt(2h/(k t_root))", u.N(u.Of(output.PerLen, m), 2), u.Name(output.PerLen))
	add("m x height", u.N(m*in.L, 3), "-")
	add("Biot number h t_root/(2k)", fmt.Sprintf("%.2g", in.h*in.t0/(2*in.k)), "-")
	method := "closed form"
	if in.profile == "annular-tapered" {
		method = "16/32-cell solve with Richardson extrapolation"
	}
	add("fin efficiency ("+method+")", u.N(eta, 4), "-")
	add("fin efficiency (finite-volume check, 400 cells)", u.N(sol.Efficiency, 4), "-")
	add("heated area "+per, u.N(u.Of(output.Area, area*width)*map[bool]float64{true: 1e4, false: 1}[!u.US && annular], 2), map[bool]string{true: "cm2", false: u.Name(output.Area)}[!u.US && annular])
	add("heat rate "+per+" at "+fmtT(u, in.tw)+" wall, "+fmtT(u, in.ta)+" air ("+u.Name(output.Temp)+")", u.N(u.Of(qUnit, q), 1), u.Name(qUnit))
	doc := output.Doc{Title: "Single fin", Grids: []output.Grid{g}, Caution: true,
		Notes: []string{"Efficiency is heat over the heat of the whole fin at the root temperature; sources in 'go doc finmarch/fins'."}}
	for _, w := range log.Warnings() {
		doc.Warnings = append(doc.Warnings, w.String())
	}
	doc.JSON = map[string]any{"profile": in.profile, "efficiency": eta, "solver_efficiency": sol.Efficiency, "heat_rate_W": q,
		"area_m2": area, "fin_parameter_per_m": m, "fin_parameter_times_height": m * in.L,
		"inputs": map[string]any{"height_m": in.L, "root_thickness_m": in.t0, "tip_thickness_m": in.t1, "root_diameter_m": in.d, "h_W_m2K": in.h,
			"conductivity_W_mK": in.k, "alloy": in.alloy.Name, "wall_K": in.tw, "air_K": in.ta},
		"biot": in.h * in.t0 / (2 * in.k), "per": jsonPer, "warnings": doc.Warnings, "caution": output.Caution}
	return e.emit(doc)
}
