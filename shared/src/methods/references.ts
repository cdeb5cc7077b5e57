/**
 * The literature the methods note cites, as plain text and BibTeX. Only what the note uses.
 *
 * Provenance of the bibliographic data (so that nobody mistakes recalled data for checked data):
 * the DOIs, volumes and page ranges of Simon 1976, Blanes et al. 2009, Blanes, Casas & Ros 2000,
 * Tiesinga et al. 2021 and Schwerdtfeger & Nagle 2019 were compared with independent public
 * citations found while writing this file; Avron, Herbst & Simon 1981 (first page only, no DOI),
 * Brent 1973, Trefethen 2013 and the DLMF editors are from memory and are not verified here.
 * Authors of a paper should check every entry against the publisher before submission.
 */
export interface Reference {
  key: string;
  /** One-line citation for the plain-text reference list. */
  text: string;
  bibtex: string;
}

export const REFERENCES = {
  simon1976: {
    key: 'simon1976weak',
    text: 'B. Simon, "The bound state of weakly coupled Schrödinger operators in one and two dimensions", Ann. Phys. (N.Y.) 97, 279–288 (1976), doi:10.1016/0003-4916(76)90038-5.',
    bibtex: `@article{simon1976weak,
  author  = {Simon, Barry},
  title   = {The bound state of weakly coupled {Schr{\\"o}dinger} operators in one and two dimensions},
  journal = {Annals of Physics},
  volume  = {97},
  pages   = {279--288},
  year    = {1976},
  doi     = {10.1016/0003-4916(76)90038-5}
}`,
  },
  avron1981: {
    key: 'avron1981magnetic',
    text: 'J. E. Avron, I. W. Herbst, B. Simon, "Schrödinger operators with magnetic fields. III. Atoms in homogeneous magnetic field", Commun. Math. Phys. 79, 529 (1981).',
    bibtex: `@article{avron1981magnetic,
  author  = {Avron, Joseph E. and Herbst, Ira W. and Simon, Barry},
  title   = {{Schr{\\"o}dinger} operators with magnetic fields. {III}. {Atoms} in homogeneous magnetic field},
  journal = {Communications in Mathematical Physics},
  volume  = {79},
  pages   = {529},
  year    = {1981}
}`,
  },
  dlmf: {
    key: 'dlmf',
    text: 'NIST Digital Library of Mathematical Functions, https://dlmf.nist.gov/, F. W. J. Olver, A. B. Olde Daalhuis, D. W. Lozier, B. I. Schneider, R. F. Boisvert, C. W. Clark, B. R. Miller, B. V. Saunders, H. S. Cohl, M. A. McClain, eds., chapters 8 and 13 (state the release you consulted).',
    bibtex: `@misc{dlmf,
  key          = {DLMF},
  title        = {{NIST} Digital Library of Mathematical Functions},
  editor       = {Olver, F. W. J. and Olde Daalhuis, A. B. and Lozier, D. W. and Schneider, B. I. and Boisvert, R. F. and Clark, C. W. and Miller, B. R. and Saunders, B. V. and Cohl, H. S. and McClain, M. A.},
  howpublished = {\\url{https://dlmf.nist.gov/}},
  note         = {Chapters 8 and 13; add the release number and the date you consulted it}
}`,
  },
  blanes2009: {
    key: 'blanes2009magnus',
    text: 'S. Blanes, F. Casas, J. A. Oteo, J. Ros, "The Magnus expansion and some of its applications", Phys. Rep. 470, 151–238 (2009), doi:10.1016/j.physrep.2008.11.001.',
    bibtex: `@article{blanes2009magnus,
  author  = {Blanes, Sergio and Casas, Fernando and Oteo, Jos{\\'e} A. and Ros, Jos{\\'e}},
  title   = {The {Magnus} expansion and some of its applications},
  journal = {Physics Reports},
  volume  = {470},
  number  = {5--6},
  pages   = {151--238},
  year    = {2009},
  doi     = {10.1016/j.physrep.2008.11.001}
}`,
  },
  blanes2000: {
    key: 'blanes2000improved',
    text: 'S. Blanes, F. Casas, J. Ros, "Improved high order integrators based on the Magnus expansion", BIT Numer. Math. 40, 434–450 (2000), doi:10.1023/A:1022311628317.',
    bibtex: `@article{blanes2000improved,
  author  = {Blanes, Sergio and Casas, Fernando and Ros, Javier},
  title   = {Improved high order integrators based on the {Magnus} expansion},
  journal = {BIT Numerical Mathematics},
  volume  = {40},
  number  = {3},
  pages   = {434--450},
  year    = {2000},
  doi     = {10.1023/A:1022311628317}
}`,
  },
  brent1973: {
    key: 'brent1973algorithms',
    text: 'R. P. Brent, Algorithms for Minimization without Derivatives (Prentice-Hall, Englewood Cliffs, NJ, 1973), ch. 4.',
    bibtex: `@book{brent1973algorithms,
  author    = {Brent, Richard P.},
  title     = {Algorithms for Minimization without Derivatives},
  publisher = {Prentice-Hall},
  address   = {Englewood Cliffs, NJ},
  year      = {1973}
}`,
  },
  trefethen2013: {
    key: 'trefethen2013approximation',
    text: 'L. N. Trefethen, Approximation Theory and Approximation Practice (SIAM, Philadelphia, 2013).',
    bibtex: `@book{trefethen2013approximation,
  author    = {Trefethen, Lloyd N.},
  title     = {Approximation Theory and Approximation Practice},
  publisher = {SIAM},
  address   = {Philadelphia},
  year      = {2013}
}`,
  },
  tiesinga2021: {
    key: 'tiesinga2021codata',
    text: 'E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, "CODATA recommended values of the fundamental physical constants: 2018", Rev. Mod. Phys. 93, 025010 (2021), doi:10.1103/RevModPhys.93.025010.',
    bibtex: `@article{tiesinga2021codata,
  author  = {Tiesinga, Eite and Mohr, Peter J. and Newell, David B. and Taylor, Barry N.},
  title   = {{CODATA} recommended values of the fundamental physical constants: 2018},
  journal = {Reviews of Modern Physics},
  volume  = {93},
  pages   = {025010},
  year    = {2021},
  doi     = {10.1103/RevModPhys.93.025010}
}`,
  },
  schwerdtfeger2019: {
    key: 'schwerdtfeger2019table',
    text: 'P. Schwerdtfeger, J. K. Nagle, "2018 Table of static dipole polarizabilities of the neutral elements in the periodic table", Mol. Phys. 117, 1200–1225 (2019), doi:10.1080/00268976.2018.1535143.',
    bibtex: `@article{schwerdtfeger2019table,
  author  = {Schwerdtfeger, Peter and Nagle, Jeffrey K.},
  title   = {2018 {Table} of static dipole polarizabilities of the neutral elements in the periodic table},
  journal = {Molecular Physics},
  volume  = {117},
  number  = {9--12},
  pages   = {1200--1225},
  year    = {2019},
  doi     = {10.1080/00268976.2018.1535143}
}`,
  },
} as const satisfies Record<string, Reference>;

export type ReferenceId = keyof typeof REFERENCES;
