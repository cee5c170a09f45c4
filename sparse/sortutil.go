package sparse

import "slices"

func slicesSort(s []int32) { slices.Sort(s) }
