// Every built-in of the sheet, grouped by file. Add a file's list here (see DEVELOPERS.md).
import type { Builtin } from '../sheet/builtin';
import { cosmologyBuiltins } from './cosmology';
import { populationBuiltins } from './population';
import { binaryEvolutionBuiltins } from './binaryEvolution';
import { phenomHardeningBuiltins } from './phenomHardening';
import { spectrumBuiltins } from './spectrum';
import { orbitBuiltins } from './orbits';
import { environmentBuiltins } from './environment';
import { hostEnvironmentBuiltins } from './hostEnvironment';
import { statisticsBuiltins } from './statistics';
import { freeSpectrumBuiltins } from './freeSpectrum';
import { inferenceBuiltins } from './inference';
import { arrayViewBuiltins } from './arrayView';
import { utilityBuiltins } from './utility';
import { realisationBuiltins } from './realisations';
import { massFunctionCheckBuiltins } from './massFunctionCheck';
import { galaxyPairBuiltins } from './galaxyPairs';
import { mergerTableBuiltins } from './mergerTable';

export function allBuiltins(): Builtin[] {
  return [
    ...utilityBuiltins,
    ...cosmologyBuiltins,
    ...populationBuiltins,
    ...massFunctionCheckBuiltins,
    ...galaxyPairBuiltins,
    ...mergerTableBuiltins,
    ...binaryEvolutionBuiltins,
    ...phenomHardeningBuiltins,
    ...spectrumBuiltins,
    ...orbitBuiltins,
    ...environmentBuiltins,
    ...hostEnvironmentBuiltins,
    ...statisticsBuiltins,
    ...freeSpectrumBuiltins,
    ...inferenceBuiltins,
    ...arrayViewBuiltins,
    ...realisationBuiltins,
  ];
}
