// Every drawn diagram, in the order the catalogue lists them.
import type { Diagram } from './svg';
import { lightTriangle } from './triangle';

export const diagrams: Diagram[] = [lightTriangle];
