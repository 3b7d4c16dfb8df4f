" Syntax for SMILES list files: one record a line, a title after the first
" blank, '#' comment lines. Token classes after the OpenSMILES
" specification.
if exists("b:current_syntax")
  finish
endif

syn match smilesComment  "^\s*#.*$"
syn match smilesTitle    ".*$" contained
syn match smilesRecord   "^\s*[^#[:space:]]\S*" contains=smilesBracket,smilesAtom,smilesStereo,smilesBond,smilesRing,smilesBranch,smilesReaction nextgroup=smilesTitle skipwhite
syn region smilesBracket matchgroup=smilesBracketDelim start="\[" end="\]" contained oneline contains=smilesChirality
syn match smilesChirality "@\(TH[12]\|AL[12]\|SP[1-3]\|TB\d\{1,2}\|OH\d\{1,2}\|@\)\=" contained
syn match smilesAtom     "Cl\|Br\|[BCNOSPFI*bcnosp]" contained
syn match smilesStereo   "[/\\]" contained
syn match smilesBond     "[-=#$:~]" contained
syn match smilesRing     "%\d\d\|\d" contained
syn match smilesBranch   "[()]" contained
syn match smilesReaction "[>.]" contained

hi def link smilesComment     Comment
hi def link smilesTitle       String
hi def link smilesAtom        Identifier
hi def link smilesBracketDelim Delimiter
hi def link smilesBracket     Identifier
hi def link smilesChirality   Special
hi def link smilesStereo      Special
hi def link smilesBond        Operator
hi def link smilesRing        Number
hi def link smilesBranch      Delimiter
hi def link smilesReaction    Operator

let b:current_syntax = "smiles"
