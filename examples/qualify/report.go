package main

import (
	"fmt"
	"math"

	"github.com/dzf-go/dzf/lethality"
	"github.com/dzf-go/dzf/resistance"
	"github.com/dzf-go/dzf/survivor"
)

// report is everything the program shows, text and JSON alike: the text is
// printed from it and -json marshals it.
type report struct {
	Title      string            `json:"title"`
	Label      resistance.Label  `json:"label"`
	Inputs     []source          `json:"inputs"`
	Settings   settings          `json:"settings"`
	Population populationPart    `json:"population"`
	Resistance resistancePart    `json:"resistance"`
	Z          zPart             `json:"z"`
	LabelCheck resistance.Report `json:"label_check"`
	Cycle      cyclePart         `json:"cycle"`
	Indicator  indicatorPart     `json:"indicator"`
	Claims     claimsPart        `json:"claims"`
	Warnings   []string          `json:"warnings,omitempty"`
	Cautions   []string          `json:"cautions"`
}

const title = "Indicator lot qualification and cycle judgement"

// settings are the settings in force.
type settings struct {
	Level         float64             `json:"level"`
	HSKLevel      float64             `json:"hsk_level"`
	Sterilization float64             `json:"sterilization_celsius"`
	Band          float64             `json:"band"`
	F0            lethality.Reference `json:"f0_reference"`
	Log10SAL      float64             `json:"log10_sal"`
	Profile       *resistance.Profile `json:"profile,omitempty"`
	Criteria      resistance.Criteria `json:"criteria"`
	ZFrom         string              `json:"z_from"`
	Survivor      survivor.Settings   `json:"survivor_settings"`
}

// buildReport computes every part of the report. It fails only when the
// data cannot give a report at all (no population, no cycle).
func buildReport(cfg config, in inputs) (report, error) {
	prof, _ := profileFor(cfg.profile, in.Label)
	r := report{Title: title, Label: in.Label, Inputs: in.Sources}
	r.Settings = settings{
		Level: cfg.level, HSKLevel: fractionHSKLevel, Sterilization: cfg.sterilization, Band: cfg.band,
		F0:       lethality.Reference{Name: "F0", TRef: cfg.tRef, Z: cfg.zRef, Status: f0Status(cfg)},
		Log10SAL: cfg.log10SAL, Profile: prof, ZFrom: zFromName(cfg.zFrom),
		Survivor: survivor.Settings{Level: cfg.level, ExcludeBelowDetection: cfg.excludeZero},
	}
	r.Settings.Criteria = resistance.DefaultCriteria()
	r.Settings.Criteria.Profile = prof
	var err error
	if r.Population, err = populationOf(in, cfg.level); err != nil {
		return r, err
	}
	log10N0 := r.Population.Assay.Log10Mean
	r.Resistance = resistanceOf(in, log10N0, r.Settings)
	r.Z = zOf(in, r.Resistance, r.Settings)
	if r.LabelCheck, err = labelCheckOf(in, r); err != nil {
		return r, err
	}
	if r.Cycle, err = cycleOf(in, r.Settings); err != nil {
		return r, err
	}
	if r.Indicator, err = indicatorOf(in, r); err != nil {
		return r, err
	}
	r.Claims = claimsOf(in, r)
	r.Warnings = runWarnings(in, r)
	r.Cautions = cautionsOf(r)
	return r, nil
}

// f0Status says where the F0 reference comes from.
func f0Status(cfg config) string {
	ref := lethality.MoistHeat()
	if cfg.tRef == ref.TRef && cfg.zRef == ref.Z {
		return ref.Status
	}
	return "set by -tref and -zref"
}

// populationPart is the population assay against the label.
type populationPart struct {
	Assay survivor.Population `json:"assay"`
	// Label is the labelled population, Ratio the measured mean over it,
	// Log10Label its log10.
	Label      float64 `json:"label"`
	Log10Label float64 `json:"log10_label"`
	Ratio      float64 `json:"ratio_to_label"`
	// SetAside lists the plates set aside by unit label and plate number
	// counted from 1 within the unit, as the file lists them.
	SetAside []setAside `json:"set_aside,omitempty"`
}

// setAside is a plate set aside, named for reading.
type setAside struct {
	Unit     string  `json:"unit"`
	Plate    int     `json:"plate"`
	Colonies float64 `json:"colonies"`
	Dilution float64 `json:"dilution"`
	Reason   string  `json:"reason"`
}

func populationOf(in inputs, level float64) (populationPart, error) {
	pop, err := survivor.CountPopulation(in.Units, &survivor.PopulationSettings{Level: level})
	if err != nil {
		return populationPart{}, fmt.Errorf("population assay (%s): %w", sourceName(in, "population"), err)
	}
	p := populationPart{Assay: pop, Label: in.Label.Population, Log10Label: math.Log10(in.Label.Population),
		Ratio: pop.Mean / in.Label.Population}
	for _, s := range pop.SetAside {
		p.SetAside = append(p.SetAside, setAside{Unit: in.Units[s.Unit].Label, Plate: s.Plate + 1, Colonies: s.Colonies, Dilution: s.Dilution, Reason: s.Reason})
	}
	return p, nil
}

// log10N0 is the measured population as an estimate for the label check.
func (p populationPart) log10N0() resistance.Estimate {
	a := p.Assay
	return resistance.Estimate{Value: a.Log10Mean, Lower: a.Log10Lower, Upper: a.Log10Upper, Level: a.Level,
		Method: "population assay: log10 of the mean count per unit, t-based limits of the mean"}
}

// sourceName returns the name of an input's source.
func sourceName(in inputs, input string) string {
	for _, s := range in.Sources {
		if s.Input == input {
			return s.Name
		}
	}
	return input
}
