# want-after «C[C@H](N)C(=O)O» want-after «[CX3](=O)[OX2H1]» dialect «smarts» want-after «CCO» want-after «c1ccccc1»
"""Project Larkspur structure rules: filters, salt patterns and reaction
templates, written the way cheminformatics modules commonly are (the
patterns are real SMARTS of the trade; the module is invented).

>>> from rdkit import Chem
>>> m = Chem.MolFromSmiles('C[C@H](N)C(=O)O')
>>> len(m.GetSubstructMatches(Chem.MolFromSmarts('[CX3](=O)[OX2H1]')))
1
>>> for smi in ['CCO', 'c1ccccc1']:
...     print(Chem.MolFromSmiles(smi).GetNumAtoms())
3
6
"""
from collections import namedtuple

from rdkit import Chem
from rdkit.Chem import AllChem

# Query patterns under a name that says so; 'I' spells structure, so it
# is a pattern too.
AlertSmarts = [
    '[CX4][Cl,Br,I]',  # want «[CX4][Cl,Br,I]» dialect «smarts»
    '[CH1](=O)',  # want «[CH1](=O)» dialect «smarts»
    'I',  # want «I» dialect «smarts»
    'C=!@CC=[O,S]',  # want «C=!@CC=[O,S]» dialect «smarts»
]
Alerts = [Chem.MolFromSmarts(s) for s in AlertSmarts]

# A dictionary of keys: one position of its tuples holds patterns, so the
# SMILES-valid ones among them are patterns too.
keys = {
    34: ('[CH2]=*', 0),  # want «[CH2]=*» dialect «smarts»
    35: ('[Li,Na,K,Rb,Cs,Fr]', 0),  # want «[Li,Na,K,Rb,Cs,Fr]» dialect «smarts»
    36: ('[#16R]', 0),  # want «[#16R]» dialect «smarts»
}

# One argument of one constructor throughout the file.
AcidBasePair = namedtuple('AcidBasePair', 'name acid base')
PAIRS = (
    AcidBasePair('-CO2H', 'C(=O)[OH]', 'C(=O)[O-]'),  # want «C(=O)[OH]» dialect «smarts» want «C(=O)[O-]» dialect «smarts»
    AcidBasePair('-SO3H', '[!O]S(=O)(=O)[OH]', '[!O]S(=O)(=O)[O-]'),  # want «[!O]S(=O)(=O)[OH]» dialect «smarts» want «[!O]S(=O)(=O)[O-]» dialect «smarts»
    AcidBasePair('thiophenol', 'c[SH]', 'c[S-]'),  # want «c[SH]» dialect «smarts» want «c[S-]» dialect «smarts»
)

# A reaction-named constructor: the template is a pattern by its content,
# the element letter is a word, the examples split at their commas (one
# with a ring digit after a branch, which the reader warns about).
Rule = namedtuple('HeteroAtomReaction', 'smarts element examples')
RULES = [
    Rule("[c;x2;D2;r5:1]([n;x2;r5:2])[n;x2;r5:3]>>[n:1]([n:2])[n:3]", "c", "c1nc[nH]c1,c1nncn([*])1"),  # want «[c;x2;D2;r5:1]([n;x2;r5:2])[n;x2;r5:3]>>[n:1]([n:2])[n:3]» dialect «smarts» want «c1nc[nH]c1» want «c1nncn([*])1»
]

# Fragmentation templates: bond queries and wildcards with maps.
reactionDefs = (
    "[C:1]=!@[C:2]>>[C:1]*.*[C:2]",  # want «[C:1]=!@[C:2]>>[C:1]*.*[C:2]» dialect «smarts»
    "[#7;+0;D2,D3:1]!@C(!@=O)!@[#7;+0;D2,D3:2]>>*[#7:1].[#7:2]*",  # want «[#7;+0;D2,D3:1]!@C(!@=O)!@[#7;+0;D2,D3:2]>>*[#7:1].[#7:2]*» dialect «smarts»
)
SN2 = AllChem.ReactionFromSmarts('[C:1][C@H:2](Br)[C:4]>>[C:1][C@@H:2](O)[C:4]')  # want «[C:1][C@H:2](Br)[C:4]>>[C:1][C@@H:2](O)[C:4]» dialect «smarts»

# A pattern built from pieces when the program runs is no record.
HAcceptor = Chem.MolFromSmarts('[$([O,S;H1;v2]-[!$(*=[O,N,P,S])]),' +
                               '$([O,S;H0;v2]),$([O,S;-])]')

# Words and labels under names: not notation.
class Format:
    SMARTS = 'smarts'
    SMILES = 'smiles'
reaction_label = "R1a"
smiles_name = "WATER"
smiles = "WATER"
rxn = "R1"

# Firm places read what they are given.
water = Chem.MolFromSmiles('O')  # want «O»
broken = Chem.MolFromSmiles('WATER')  # want «WATER»

# Several records in one string, and a mixed one that is not notation.
smiles_list = "CCO,CCN;CCC"  # want «CCO» want «CCN» want «CCC»
smiles_note = "CCO is ethanol"

# A molfile held in a string is another format.
rxn_block = """$RXN

  Larkspur

  1  1
$MOL

  RDKit          2D

  1  0  0  0  0  0  0  0  0  0999 V2000
    0.0000    0.0000    0.0000 C   0  0  0  0  0  0  0  0  0  0  0  0
M  END
"""
