import { addComponent, defineNuxtModule } from 'nuxt/kit'

// vue-konva's components (<v-stage>, <v-layer>, <v-line>…) for the pages that draw on a canvas. Each one is
// an auto-imported component, so a component that uses one imports it where it is used and Konva lands in
// the chunks of the canvas pages alone; registering the library as a global plugin put all of Konva in the
// entry chunk of every page. Konva draws only in the browser (the desk renders its canvas in <ClientOnly>), but
// the components are registered for both sides, not as client-only components: those wrap each node in a
// component that renders a tick later, which reorders the stage's layers. Konva imports cleanly on the server.
const KONVA_COMPONENTS = [
  'Stage', 'Layer', 'FastLayer', 'Group', 'Label', 'Tag', 'Transformer',
  'Arc', 'Arrow', 'Circle', 'Ellipse', 'Image', 'Line', 'Path', 'Rect', 'RegularPolygon', 'Ring', 'Shape',
  'Sprite', 'Star', 'Text', 'TextPath', 'Wedge',
]

export default defineNuxtModule({
  meta: { name: 'shadowline-vue-konva' },
  setup() {
    for (const name of KONVA_COMPONENTS) {
      addComponent({ name: `V${name}`, export: name, filePath: 'vue-konva' })
    }
  },
})
