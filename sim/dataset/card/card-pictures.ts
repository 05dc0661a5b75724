// Which SVG pictures a dataset card has and what they are called: per split a page of parameter
// histograms (card/params-<split>.svg), one scatter page (card/scatter.svg) and one contact
// sheet (card/episodes.svg), each present only when it has something to draw. Like CARD.md they
// are made from the folder's content alone (tally, scenario, a few episode files), never the
// run, so every copy of a dataset has the same bytes.
import { chartColour } from '../../plots/chart-colours.ts';
import type { HeldOutRule } from '../../scenario/scenario-types.ts';
import { CARD_PICTURES_FOLDER } from '../manifest/dataset-files.ts';
import type { SheetEpisode } from './card-contact-sheet.ts';
import { renderContactSheet } from './card-contact-sheet.ts';
import { parameterHistograms, parameterScatter } from './card-parameter-pictures.ts';
import type { CardTally } from './card-tally.ts';

export interface CardPicture {
  /** Path inside the dataset folder, '/'-separated, as CARD.md links it and the manifest lists it. */
  path: string;
  /** What the picture shows, the image's alternative text in CARD.md. */
  alt: string;
  text: string;
}

export interface CardPictureSource {
  tally: CardTally;
  heldOut: readonly HeldOutRule[];
  /** Splits in the folder's order (train, validation, test, held-out ones, others). */
  splits: readonly string[];
  sheetEpisodes: readonly SheetEpisode[];
}

export function renderCardPictures(source: CardPictureSource): CardPicture[] {
  // A split's colour is the palette's colour at its place in the folder's split order, in every picture.
  const colourOf = (split: string) => chartColour(Math.max(0, source.splits.indexOf(split)));
  const pictures: CardPicture[] = [];
  for (const [split, text] of parameterHistograms(source.tally, source.heldOut, source.splits, colourOf)) {
    pictures.push({ path: `${CARD_PICTURES_FOLDER}/params-${split}.svg`, alt: `Histograms of the sampled parameters, split ${split}`, text });
  }
  const scatter = parameterScatter(source.tally, source.splits, colourOf);
  if (scatter !== null) pictures.push({ path: `${CARD_PICTURES_FOLDER}/scatter.svg`, alt: 'Scatter of the most widely spread parameters, by split', text: scatter });
  if (source.sheetEpisodes.length > 0) {
    pictures.push({ path: `${CARD_PICTURES_FOLDER}/episodes.svg`, alt: 'First and last frame of a few episodes, from above and from the side', text: renderContactSheet(source.sheetEpisodes, colourOf) });
  }
  return pictures;
}
