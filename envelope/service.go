package envelope

import "govern/combos"

// split returns the indices of the combinations the forces are enveloped
// over and those the deflections are: strength combinations (not marked
// Service) for forces, or every combination when all are service ones;
// the service combinations for deflections.
func split(cs []combos.Combination) (strength, service []int) {
	for k, cb := range cs {
		if cb.Service {
			service = append(service, k)
		} else {
			strength = append(strength, k)
		}
	}
	if len(strength) == 0 {
		strength = service
	}
	return strength, service
}

// pick returns the combinations of cs at the indices idx.
func pick(cs []combos.Combination, idx []int) []combos.Combination {
	out := make([]combos.Combination, len(idx))
	for i, k := range idx {
		out[i] = cs[k]
	}
	return out
}
