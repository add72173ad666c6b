package exact

// Rings: the variables of polynomials, in the order that fixes the term
// order, and the term cap.

import (
	"fmt"
	"math/big"
	"sync"
)

// DefaultMaxTerms is the term cap of a Ring on which SetMaxTerms was not
// called (or was called with 0).
var DefaultMaxTerms = 4_000_000

// Ring is an ordered, growable set of variable names. Polynomials made in
// the same ring combine; the variable order is the order of creation and
// fixes the canonical term order. A Ring also holds the term cap. A Ring is
// safe for concurrent use.
type Ring struct {
	mu       sync.RWMutex
	names    []string
	index    map[string]int
	maxTerms int
}

// NewRing returns a ring without variables and with the default term cap.
func NewRing() *Ring {
	return &Ring{index: map[string]int{}}
}

// Var returns the variable called name, adding it to the ring if it is new.
// Names follow identifier syntax, [A-Za-z_][A-Za-z0-9_]*; anything else
// gives ErrSyntax.
func (r *Ring) Var(name string) (*Poly, error) {
	if !isIdent(name) {
		return nil, fmt.Errorf("variable name %q: want a letter or _ followed by letters, digits or _: %w", name, ErrSyntax)
	}
	return r.varPoly(r.addVar(name)), nil
}

func (r *Ring) addVar(name string) int {
	r.mu.Lock()
	defer r.mu.Unlock()
	if i, ok := r.index[name]; ok {
		return i
	}
	r.names = append(r.names, name)
	r.index[name] = len(r.names) - 1
	return len(r.names) - 1
}

// varPoly returns the polynomial of variable v.
func (r *Ring) varPoly(v int) *Poly {
	m := varPow(v, 1)
	return &Poly{ring: r, w: len(m), mono: m, num: []int64{1}}
}

func isIdent(s string) bool {
	if s == "" {
		return false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '_', 'a' <= c && c <= 'z', 'A' <= c && c <= 'Z':
		case '0' <= c && c <= '9' && i > 0:
		default:
			return false
		}
	}
	return true
}

// Names returns the variable names in ring order.
func (r *Ring) Names() []string {
	r.mu.RLock()
	defer r.mu.RUnlock()
	return append([]string(nil), r.names...)
}

// Index returns the index of the variable called name, and whether the ring
// has it.
func (r *Ring) Index(name string) (int, bool) {
	r.mu.RLock()
	defer r.mu.RUnlock()
	i, ok := r.index[name]
	return i, ok
}

func (r *Ring) numVars() int {
	r.mu.RLock()
	defer r.mu.RUnlock()
	return len(r.names)
}

func (r *Ring) name(v int) string {
	r.mu.RLock()
	defer r.mu.RUnlock()
	if v < len(r.names) {
		return r.names[v]
	}
	return fmt.Sprintf("x%d", v)
}

// SetMaxTerms sets the term cap: operations that can blow up (Mul, Pow,
// Substitute, and what is built on them) fail with ErrTooManyTerms instead
// of producing a polynomial with more than n terms. n <= 0 restores
// DefaultMaxTerms.
func (r *Ring) SetMaxTerms(n int) {
	r.mu.Lock()
	defer r.mu.Unlock()
	if n < 0 {
		n = 0
	}
	r.maxTerms = n
}

// MaxTerms returns the term cap.
func (r *Ring) MaxTerms() int {
	r.mu.RLock()
	defer r.mu.RUnlock()
	if r.maxTerms == 0 {
		return DefaultMaxTerms
	}
	return r.maxTerms
}

func tooManyTerms(op string, limit int) error {
	return fmt.Errorf("%s: the result would have more than %d terms, the term cap (raise it with the flag --max-terms): %w", op, limit, ErrTooManyTerms)
}

// Const returns the constant polynomial c (a copy); nil gives 0.
func (r *Ring) Const(c *big.Rat) *Poly {
	if c == nil || c.Sign() == 0 {
		return r.zero()
	}
	b := newBuilder(1)
	b.pushBig(constMono[:], c.Num())
	return b.poly(r, c.Denom())
}

var constMono = [1]uint64{0}

func (r *Ring) zero() *Poly { return &Poly{ring: r, w: 1} }

func (r *Ring) one() *Poly { return &Poly{ring: r, w: 1, mono: []uint64{0}, num: []int64{1}} }
