package election

// ResultVersion is the version of the election result document (its
// schema is in the package documentation; engine/format builds it).
const ResultVersion = 1

// ResultKind is the kind member of an election result document.
const ResultKind = "election-result"
