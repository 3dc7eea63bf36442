package steptest

import (
	"fmt"
	"math"

	"fieldfit/models/units"
)

// SecondSquaredPerFootFifth is one s²/ft⁵ in SI, s²/m⁵: 1/(0.3048 m)⁵ =
// 380.13… s²/m⁵ (exact from 1 ft = 0.3048 m, NIST SP 811 (2008) App. B;
// reference §9). It converts Jacob's C between the foot–second units of the
// well-condition classes and SI: C[s²/ft⁵] = C[s²/m⁵] / SecondSquaredPerFootFifth.
const SecondSquaredPerFootFifth = 1 / (units.Foot * units.Foot * units.Foot * units.Foot * units.Foot)

// ConditionSource names where the well-condition classes come from.
const ConditionSource = "Walton (1962), Illinois State Water Survey Bulletin 49 (from memory; guidance only)"

// Class is a well-condition class of Walton (1962) for Jacob's nonlinear
// loss coefficient C.
type Class int

const (
	// NoClass: C is not positive, or unknown, so no class applies.
	NoClass Class = iota
	// ProperlyDeveloped: C < 5 s²/ft⁵.
	ProperlyDeveloped
	// MildDeterioration: 5 ≤ C < 10 s²/ft⁵.
	MildDeterioration
	// SevereClogging: 10 ≤ C < 40 s²/ft⁵.
	SevereClogging
	// DifficultToRestore: C ≥ 40 s²/ft⁵.
	DifficultToRestore
)

// classBounds holds the lower bound of each class in s²/ft⁵ (Walton 1962,
// from memory, as in reference §8).
var classBounds = [...]float64{ProperlyDeveloped: 0, MildDeterioration: 5, SevereClogging: 10, DifficultToRestore: 40}

func (c Class) String() string {
	switch c {
	case NoClass:
		return "no class"
	case ProperlyDeveloped:
		return "properly developed"
	case MildDeterioration:
		return "mild deterioration"
	case SevereClogging:
		return "severe clogging"
	case DifficultToRestore:
		return "difficult to restore"
	}
	return fmt.Sprintf("Class(%d)", int(c))
}

// Bounds returns the range of C of the class in s²/ft⁵, lower bound
// included; the upper bound of DifficultToRestore is +Inf. NoClass has NaN
// bounds.
func (c Class) Bounds() (from, to float64) {
	if c < ProperlyDeveloped || c > DifficultToRestore {
		return math.NaN(), math.NaN()
	}
	from, to = classBounds[c], math.Inf(1)
	if c < DifficultToRestore {
		to = classBounds[c+1]
	}
	return from, to
}

// classOf returns the class of C given in s²/ft⁵.
func classOf(cft float64) Class {
	if bad(cft) && !math.IsInf(cft, 1) || !(cft > 0) {
		return NoClass
	}
	for c := DifficultToRestore; c > ProperlyDeveloped; c-- {
		if cft >= classBounds[c] {
			return c
		}
	}
	return ProperlyDeveloped
}

// Condition is the well-condition class of a nonlinear loss coefficient,
// shown as guidance with its source.
type Condition struct {
	// CFeet is C in s²/ft⁵, the unit of the classes.
	CFeet float64
	// Class is the class of CFeet.
	Class Class
	// LowerClass and UpperClass are the classes of the ends of C's
	// confidence interval (NoClass when an end is not positive or not
	// known); they are set by LossFit.Condition only.
	LowerClass, UpperClass Class
	// Source names the classes' origin (ConditionSource).
	Source string
}

// String describes the condition in a plain sentence.
func (c Condition) String() string {
	if c.Class == NoClass {
		return fmt.Sprintf("C = %.3g s²/ft⁵: no well-condition class applies (C must be positive). Classes: %s.", c.CFeet, c.Source)
	}
	from, to := c.Class.Bounds()
	rng := fmt.Sprintf("%g–%g s²/ft⁵", from, to)
	switch c.Class {
	case ProperlyDeveloped:
		rng = fmt.Sprintf("below %g s²/ft⁵", to)
	case DifficultToRestore:
		rng = fmt.Sprintf("%g s²/ft⁵ or more", from)
	}
	msg := fmt.Sprintf("C = %.3g s²/ft⁵ lies in the class \"%s\" (%s)", c.CFeet, c.Class, rng)
	switch {
	case c.LowerClass == c.Class && c.UpperClass == c.Class:
	case c.LowerClass == NoClass && c.UpperClass == NoClass:
	case c.LowerClass == NoClass:
		msg += fmt.Sprintf("; its confidence interval reaches from zero or below up to \"%s\"", c.UpperClass)
	default:
		msg += fmt.Sprintf("; its confidence interval reaches from \"%s\" to \"%s\"", c.LowerClass, c.UpperClass)
	}
	return msg + ". Classes: " + c.Source + "."
}

// WellCondition returns the well-condition class of Jacob's nonlinear loss
// coefficient c, given in SI (s²/m⁵), by the classes of Walton (1962) on C
// in s²/ft⁵ (reference §8, from memory): below 5 properly developed; 5 to
// 10 mild deterioration; 10 to 40 severe clogging; 40 and above difficult
// to restore. A lower class bound belongs to its class. The classes hold
// for n = 2 only. A c that is not a positive finite number gives NoClass
// and an *Error wrapping ErrLaw.
func WellCondition(c float64) (Condition, error) {
	cond := Condition{CFeet: c / SecondSquaredPerFootFifth, Source: ConditionSource}
	cond.Class = classOf(cond.CFeet)
	cond.LowerClass, cond.UpperClass = cond.Class, cond.Class
	if bad(c) || !(c > 0) {
		return cond, &Error{Step: -1, Reading: -1, Field: "C", Value: c, Err: ErrLaw,
			Reason: "the well-condition classes need a positive, finite C (s²/m⁵)"}
	}
	return cond, nil
}

// Condition returns the well-condition class of the fitted C with the
// classes of the ends of its confidence interval. It applies to Jacob's
// law (n = 2) only; for another n, or a C that is not positive, it returns
// an *Error wrapping ErrLaw.
func (f *LossFit) Condition() (Condition, error) {
	if f.Law.N != 2 {
		return Condition{Source: ConditionSource}, &Error{Step: -1, Reading: -1, Field: "n", Value: f.Law.N, Err: ErrLaw,
			Reason: "the well-condition classes are given for Jacob's law (n = 2) only"}
	}
	cond, err := WellCondition(f.Law.C)
	if err != nil {
		return cond, err
	}
	c, _ := f.Coefficient("C")
	cond.LowerClass = classOf(c.Lower / SecondSquaredPerFootFifth)
	cond.UpperClass = classOf(c.Upper / SecondSquaredPerFootFifth)
	return cond, nil
}
