// Every drawn diagram, in the order the catalogue lists them.
import { guideNumberDiagram } from './guide-number';
import { inverseSquareDiagram } from './inverse-square';
import { instructorPortrait } from './portrait';
import { rembrandtDiagram } from './rembrandt';
import type { Diagram } from './svg';
import { syncDiagram } from './sync';
import { lightTriangle } from './triangle';

export const diagrams: Diagram[] = [lightTriangle, guideNumberDiagram, inverseSquareDiagram, syncDiagram, rembrandtDiagram, instructorPortrait];
