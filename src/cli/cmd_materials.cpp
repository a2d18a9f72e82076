// cmd_materials
