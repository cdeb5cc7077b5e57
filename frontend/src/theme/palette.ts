// Fieldbound's own colours. Region classes are also told apart by pattern and label, never colour alone.
export const palette = {
  bound: '#1F6F78',
  resonance: '#D98E04',
  unbound: '#ECEAE4',
  ink: '#2B2D42',
  pin: '#6A4C93',
  speciesWithAnion: '#B23A48',
  speciesWithoutAnion: '#2B2D42',
  fieldBand: '#5C7AEA',
  paper: '#FBFAF7',
} as const;
