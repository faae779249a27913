// A map button that brings the whole image back into view.
import { Control, DomEvent, DomUtil } from 'leaflet';

export const FitControl = Control.extend({
  options: { position: 'topright', title: 'Show the whole image', onFit: () => {} },

  onAdd() {
    const bar = DomUtil.create('div', 'leaflet-bar fit-control');
    const button = DomUtil.create('button', 'fit-control-button', bar);
    button.type = 'button';
    button.title = this.options.title;
    button.setAttribute('aria-label', this.options.title);
    button.textContent = '⤢';
    DomEvent.disableClickPropagation(bar);
    DomEvent.on(button, 'click', () => this.options.onFit());
    return bar;
  },
});
