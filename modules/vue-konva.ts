import { addComponent, defineNuxtModule } from 'nuxt/kit'

// vue-konva's components (<v-stage>, <v-layer>, <v-line>…) for the pages that draw on a canvas. Each one is
// an auto-imported component, so a component that uses one imports it where it is used and Konva lands in
// the chunks of the canvas pages alone; registering the library as a global plugin put all of Konva in the
// entry chunk of every page. Client-only: Konva needs a DOM canvas, and the canvas renders in <ClientOnly>.
const KONVA_COMPONENTS = [
  'Stage', 'Layer', 'FastLayer', 'Group', 'Label', 'Tag', 'Transformer',
  'Arc', 'Arrow', 'Circle', 'Ellipse', 'Image', 'Line', 'Path', 'Rect', 'RegularPolygon', 'Ring', 'Shape',
  'Sprite', 'Star', 'Text', 'TextPath', 'Wedge',
]

export default defineNuxtModule({
  meta: { name: 'shadowline-vue-konva' },
  setup() {
    for (const name of KONVA_COMPONENTS) {
      addComponent({ name: `V${name}`, export: name, filePath: 'vue-konva', mode: 'client' })
    }
  },
})
